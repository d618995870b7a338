import { httpResource } from '@angular/common/http';
import { competitionListSchema } from '../../../shared/competition/competition';

/** The competition list, read from the server and checked against the shared schema. */
export function competitionListResource() {
  return httpResource(() => '/api/competitions', { parse: (raw) => competitionListSchema.parse(raw) });
}
