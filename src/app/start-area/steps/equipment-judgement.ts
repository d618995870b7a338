import { judgeEquipment } from '../../../../shared/rules/equipment';
import type { RulesProfile } from '../../../../shared/rules/rules-profile';
import { verdict } from '../../../../shared/rules/verdict';
import { attempt, judged, type StepJudgement } from './step-judgement';

export const bibNotConfirmedLine = 'Bib not confirmed: the sled does not start until the bib is right.';

export interface EquipmentAnswersSaved {
  equipment: Readonly<Record<string, boolean>> | null;
  bibConfirmed: boolean | null;
}

/** The equipment step from the saved answers: waiting until the bib and every item are answered. */
export function equipmentJudgement(profile: RulesProfile, saved: EquipmentAnswersSaved): StepJudgement {
  const present = Object.fromEntries(profile.equipment.flatMap((item) => (saved.equipment && item.id in saved.equipment ? [[item.id, saved.equipment[item.id]!]] : [])));
  const left = [...(saved.bibConfirmed === null ? ['the bib'] : []), ...profile.equipment.filter((item) => !(item.id in present)).map((item) => item.label)];
  if (left.length > 0) return { kind: 'waiting', words: `Still to answer: ${left.join(', ')}.` };
  const result = judged(attempt(() => judgeEquipment({ profile, present })));
  if (saved.bibConfirmed !== false || result.kind !== 'judged') return result;
  const equipment = result.verdict;
  const reason = equipment.outcome === 'pass' ? bibNotConfirmedLine : `${bibNotConfirmedLine} ${equipment.reason}`;
  return { kind: 'judged', verdict: verdict('equipment', 'fail', reason, { numbers: [{ label: 'Bib', text: 'not confirmed' }, ...equipment.numbers] }) };
}
