import type { CompetitionLevel, TrackType } from '../competition/competition';
import type { ValueSource } from './profile-value';
import { withProfileValue } from './profile-values';
import type { RulesProfile } from './rules-profile';
import { shippedProfile } from './shipped-profiles';

/** How tests fill a value the shipped profile leaves unset: the test's own assumption, not a rule value. */
export const enteredByTest: ValueSource = { kind: 'entered-by-organiser', verified: true, note: 'set by a test' };

/** A shipped profile with the given unset values filled in by the test. */
export function profileWith(trackType: TrackType, level: CompetitionLevel, values: Record<string, number> = {}): RulesProfile {
  return Object.entries(values).reduce(
    (profile, [path, value]) => withProfileValue(profile, path, value, enteredByTest),
    shippedProfile(trackType, level),
  );
}
