import { z } from 'zod';
import { RulesInputError } from './rules-error';
import type { RulesProfile } from './rules-profile';
import { verdict, type Verdict } from './verdict';

const presentSchema = z.record(z.string(), z.boolean());

export interface EquipmentInput {
  profile: RulesProfile;
  /** Each item of the profile's equipment list, by id: confirmed present (true) or missing (false). */
  present: Record<string, boolean>;
}

/** The visual check of the athlete's safety equipment and bib: every item must be confirmed present. */
export function judgeEquipment({ profile, present }: EquipmentInput): Verdict {
  const parsed = presentSchema.safeParse(present);
  if (!parsed.success) {
    throw new RulesInputError('invalid-input', 'Mark every equipment item as present or missing.', parsed.error.issues.map((issue) => issue.message));
  }
  const confirmed = parsed.data;
  const known = new Set(profile.equipment.map((item) => item.id));
  const unknown = Object.keys(confirmed).filter((id) => !known.has(id));
  if (unknown.length > 0) {
    throw new RulesInputError('invalid-input', `Not on this competition's equipment list: ${unknown.join(', ')}.`, unknown);
  }
  const unanswered = profile.equipment.filter((item) => !Object.hasOwn(confirmed, item.id));
  if (unanswered.length > 0) {
    throw new RulesInputError(
      'missing-value',
      `Mark as present or missing: ${unanswered.map((item) => item.label).join(', ')}.`,
      unanswered.map((item) => item.id),
    );
  }

  const missing = profile.equipment.filter((item) => confirmed[item.id] === false);
  const total = profile.equipment.length;
  const numbers = [{ label: 'Confirmed present', text: `${total - missing.length} of ${total}` }];
  if (missing.length > 0) {
    return verdict('equipment', 'fail', `No start without safety equipment: missing ${missing.map((item) => item.label).join(', ')}`, { numbers });
  }
  return verdict('equipment', 'pass', `All ${total} equipment items confirmed present.`, { numbers });
}
