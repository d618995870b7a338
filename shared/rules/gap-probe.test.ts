import { describe, expect, it } from 'vitest';
import { judgeGapProbe, type GapProbeResult } from './gap-probe';
import { shippedProfile } from './shipped-profiles';
import { thrownBy } from './expect-rules-error';

const artificial = shippedProfile('artificial', 'international');
const probe = (result: GapProbeResult) => judgeGapProbe({ profile: artificial, probe: result });

describe('judgeGapProbe', () => {
  it('when the feeler does not enter, then it passes with no follow-up', () => {
    const result = probe('no-entry');
    expect(result.check).toBe('gap-probe');
    expect(result.outcome).toBe('pass');
    expect(result.flags).toEqual([]);
  });

  it('when the feeler enters up to half the steel width, then the delegate is told and extra finish inspections follow', () => {
    const result = probe('enters-up-to-half');
    expect(result.outcome).toBe('refer-to-delegate'); // trade practice, no published source
    expect(result.flags).toEqual(['extra-finish-inspection']); // trade practice, no published source
  });

  it('when the feeler passes right across, then it is a violation on the spot', () => {
    const result = probe('passes-across');
    expect(result.outcome).toBe('fail'); // trade practice, no published source
    expect(result.reason).toContain('violation on the spot');
  });

  it('when the feeler enters beyond half but not across, then the delegate decides and the reason says the rule does not cover it', () => {
    const result = probe('enters-beyond-half');
    expect(result.outcome).toBe('refer-to-delegate');
    expect(result.flags).toEqual(['extra-finish-inspection']);
    expect(result.reason).toContain('covers only "up to half" and "right across"');
    expect(result.reason).toContain('the technical delegate decides');
  });

  it('when the probe is judged, then the feeler thickness comes from the profile and is shown', () => {
    const result = probe('no-entry');
    expect(result.used.map((used) => [used.path, used.value, used.source.kind])).toEqual([['gapProbe.feeler', 5, 'trade-practice']]);
    expect(result.numbers[0]).toEqual({ label: 'Feeler thickness', text: '0.5 mm' }); // trade practice, no published source
    expect(result.reason).toContain('0.5 mm feeler');
  });

  it('when the profile is on natural track, then the probe is refused as the wrong track type', () => {
    const error = thrownBy(() => judgeGapProbe({ profile: shippedProfile('natural', 'international'), probe: 'no-entry' }));
    expect(error.code).toBe('wrong-track-type');
  });

  it('when the feeler thickness is unset, then it is a profile gap', () => {
    const profile = structuredClone(artificial);
    if (profile.gapProbe) profile.gapProbe.feeler.value = null;
    expect(thrownBy(() => judgeGapProbe({ profile, probe: 'no-entry' })).code).toBe('profile-gap');
  });

  it('when the result is not one of the four, then it is refused', () => {
    const error = thrownBy(() => judgeGapProbe({ profile: artificial, probe: 'a-bit' as GapProbeResult }));
    expect(error.code).toBe('invalid-input');
  });
});
