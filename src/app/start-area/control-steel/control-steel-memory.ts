import { z } from 'zod';
import { competitionRulesProfileSchema, type CompetitionRulesProfile } from '../../../../shared/rules/competition-profile';
import { recordFieldSchemas } from '../../../../shared/sync/record-kinds';
import { keep, readKept } from '../../auth/local-json';

// What this screen keeps on the device between visits, so it works offline after one visit with signal.

const instrumentKey = 'rimelog.control-steel.instrument';
const rulesKey = (competitionId: string) => `rimelog.rules-profile.${competitionId}`;
const instrumentSchema = recordFieldSchemas['control-reading'].shape.instrumentId;

/** The competition's frozen rules as last fetched on this device, or null when it never was. */
export function readKeptRules(competitionId: string): CompetitionRulesProfile | null {
  const kept = readKept(rulesKey(competitionId), competitionRulesProfileSchema);
  return kept?.competitionId === competitionId ? kept : null;
}

export function keepRules(rules: CompetitionRulesProfile): void {
  keep(rulesKey(rules.competitionId), rules);
}

/** The pyrometer last keyed on this device ('' when none). */
export function readKeptInstrument(): string {
  return readKept(instrumentKey, z.string().max(64)) ?? '';
}

export function keepInstrument(text: string): void {
  keep(instrumentKey, text);
}

/** Why the keyed pyrometer id cannot go on a reading, in words, or null when it can. */
export function instrumentProblem(instrumentId: string): string | null {
  if (instrumentId.trim() === '') {
    return "Enter the pyrometer's id first: every control reading says which instrument took it.";
  }
  if (!instrumentSchema.safeParse(instrumentId.trim()).success) return "The pyrometer's id is too long: at most 64 characters.";
  return null;
}
