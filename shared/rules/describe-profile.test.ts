import { describe, expect, it } from 'vitest';
import { describeProfile } from './describe-profile';
import { acceptDemoValues } from './profile-values';
import { shippedProfile } from './shipped-profiles';

describe('describeProfile', () => {
  it('when an artificial profile is described, then each section lists its values written out with their source', () => {
    const sections = describeProfile(shippedProfile('artificial', 'international'));
    expect(sections.map((s) => s.title)).toEqual([
      'Steel temperature',
      'Control steel',
      'Weights',
      'Scale and control weights',
      'Gap probe',
      'Start area',
      'Finish inspections',
    ]);
    const floor = sections[0]!.rows.find((r) => r.path === 'temperature.floor')!;
    expect(floor).toMatchObject({ text: '+1.0 °C', source: 'trade practice, no published source', verified: true });
    const share = sections[2]!.rows.find((r) => r.path === 'weights.extraWeight.shareOfShortfall')!;
    expect(share.text).toBe('Not set');
    expect(share.verified).toBe(false);
  });

  it('when demo values fill the gaps, then they say so', () => {
    const sections = describeProfile(acceptDemoValues(shippedProfile('natural', 'national')));
    const sledMax = sections.find((s) => s.title === 'Weights')!.rows[0]!;
    expect(sledMax.text).toBe('22.0 kg');
    expect(sledMax.source).toBe('demo value, not a rule value: invented for the demo race');
  });
});
