import { z } from 'zod';
import { formatTenths } from './measurement';
import { useValue, type UsedValue } from './profile-value';
import { RulesInputError } from './rules-error';
import type { RulesProfile } from './rules-profile';
import { verdict, type Verdict } from './verdict';

/** How far the feeler went into the joint between runner and steel. */
export const gapProbeResults = ['no-entry', 'enters-up-to-half', 'enters-beyond-half', 'passes-across'] as const;
export type GapProbeResult = (typeof gapProbeResults)[number];

export const gapProbeResultLabels: Record<GapProbeResult, string> = {
  'no-entry': 'Does not enter',
  'enters-up-to-half': 'Enters up to half the steel width',
  'enters-beyond-half': 'Enters beyond half, not right across',
  'passes-across': 'Passes right across',
};

const gapProbeResultSchema = z.enum(gapProbeResults);

export interface GapProbeInput {
  profile: RulesProfile;
  probe: GapProbeResult;
}

/** The runner-to-steel gap probe at an artificial-track start. */
export function judgeGapProbe({ profile, probe }: GapProbeInput): Verdict {
  if (profile.trackType !== 'artificial') {
    throw new RulesInputError('wrong-track-type', 'The gap probe is an artificial-track check: this competition is on natural track.');
  }
  if (profile.gapProbe === null) {
    throw new RulesInputError('profile-gap', 'The rules profile has no gap probe settings. The organiser must fill them in.', ['gapProbe.feeler']);
  }
  const parsed = gapProbeResultSchema.safeParse(probe);
  if (!parsed.success) {
    throw new RulesInputError('invalid-input', `Choose how far the feeler went in: ${gapProbeResults.join(', ')}.`, [String(probe)]);
  }

  const result = parsed.data;
  const used: UsedValue[] = [];
  const feeler = formatTenths(useValue(used, 'gapProbe.feeler', profile.gapProbe.feeler, 'millimetre'), 'millimetre');
  const parts = {
    used,
    numbers: [
      { label: 'Feeler thickness', text: feeler },
      { label: 'Feeler', text: gapProbeResultLabels[result] },
    ],
  };
  const extraInspection = { ...parts, flags: ['extra-finish-inspection' as const] };

  switch (result) {
    case 'no-entry':
      return verdict('gap-probe', 'pass', `The ${feeler} feeler does not enter the joint between runner and steel.`, parts);
    case 'enters-up-to-half':
      return verdict(
        'gap-probe',
        'refer-to-delegate',
        `The ${feeler} feeler enters the joint up to half the steel width: tell the technical delegate; this sled gets extra finish inspections.`,
        extraInspection,
      );
    case 'enters-beyond-half':
      return verdict(
        'gap-probe',
        'refer-to-delegate',
        `The ${feeler} feeler enters beyond half the steel width but not right across. The rule text covers only "up to half" and "right across": the technical delegate decides. Extra finish inspections are scheduled meanwhile.`,
        extraInspection,
      );
    case 'passes-across':
      return verdict('gap-probe', 'fail', `The ${feeler} feeler passes right across the joint: a violation on the spot, report it to the technical delegate.`, parts);
    default:
      return unreachable(result);
  }
}

function unreachable(value: never): never {
  throw new RulesInputError('invalid-input', `Unknown gap probe result: ${String(value)}.`);
}
