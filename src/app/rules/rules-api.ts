import { httpResource } from '@angular/common/http';
import type { Signal } from '@angular/core';
import { competitionRulesProfileSchema } from '../../../shared/rules/competition-profile';

/** The rules profile a competition froze when it opened, checked against the shared schema. */
export function competitionRulesResource(competitionId: Signal<string>) {
  return httpResource(() => `/api/competitions/${encodeURIComponent(competitionId())}/rules-profile`, {
    parse: (raw) => competitionRulesProfileSchema.parse(raw),
  });
}
