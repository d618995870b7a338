import { describe, expect, it } from 'vitest';
import { expectRulesError } from './expect-rules-error';
import { acceptDemoValues, findProfileGaps, freezeProfileForOpening, profileValues, withProfileValue } from './profile-values';
import { rulesProfileSchema } from './rules-profile';
import { shippedProfile, shippedProfiles } from './shipped-profiles';
import { enteredByTest } from './test-profiles';

const valueAt = (profile: ReturnType<typeof shippedProfile>, path: string) => profileValues(profile).find((v) => v.path === path)?.item;

describe('shipped rules profiles', () => {
  it('when the shipped profiles are read, then all four are valid and cover both track types and every level', () => {
    const profiles = shippedProfiles();
    for (const profile of profiles) expect(rulesProfileSchema.safeParse(profile).success).toBe(true);
    expect(profiles.map((p) => p.id)).toEqual(['natural-international', 'natural-national', 'artificial-senior', 'artificial-junior-youth']);
    for (const trackType of ['natural', 'artificial'] as const) {
      for (const level of ['international', 'national', 'junior', 'youth'] as const) {
        expect(shippedProfile(trackType, level).trackType).toBe(trackType);
      }
    }
  });

  it('when the artificial senior profile is read, then its weights are the published agreed values with their source', () => {
    const profile = shippedProfile('artificial', 'international');
    // secondary published: Sports Illustrated Olympic explainer (2002); olympia2006.de; sport-komplett.de — sled max 23 kg singles, 27 kg doubles
    expect(valueAt(profile, 'weights.sledMax.singles-men')?.value).toBe(230);
    expect(valueAt(profile, 'weights.sledMax.doubles')?.value).toBe(270);
    // secondary published: rennrodeln.eu; Sports Illustrated (2002); fjl-fotodesign.de (2021) — reference 90 kg men, 75 kg women
    expect(valueAt(profile, 'weights.extraWeight.referenceBodyWeight.singles-men')?.value).toBe(900);
    expect(valueAt(profile, 'weights.extraWeight.referenceBodyWeight.singles-women')?.value).toBe(750);
    // secondary published: Sports Illustrated (2002); olympia2006.de; rennrodeln.eu; sport-komplett.de — caps 13 / 10 / 10 kg
    expect(valueAt(profile, 'weights.extraWeight.cap.singles-men')?.value).toBe(130);
    expect(valueAt(profile, 'weights.extraWeight.cap.singles-women')?.value).toBe(100);
    expect(valueAt(profile, 'weights.extraWeight.cap.doubles')?.value).toBe(100);
    expect(valueAt(profile, 'weights.sledMax.doubles')?.source).toMatchObject({ kind: 'secondary-published', verified: true });
    // secondary published: Sports Illustrated (2002); olympia2006.de give 180 kg, one other source 190 kg — so unverified
    expect(valueAt(profile, 'weights.extraWeight.doublesPairReference')).toMatchObject({ value: 1800, source: { verified: false } });
  });

  it('when a value has no agreed source, then it ships unset: share of shortfall, natural sled maximum and dimensions', () => {
    // rules-facts.md: share of the shortfall, natural-track sled maximum, steel angles are not agreed
    expect(valueAt(shippedProfile('artificial', 'international'), 'weights.extraWeight.shareOfShortfall')?.value).toBeNull();
    const natural = shippedProfile('natural', 'national');
    expect(valueAt(natural, 'weights.sledMax.singles-men')?.value).toBeNull();
    expect(valueAt(natural, 'dimensions.steel-angle.min')?.value).toBeNull();
    expect(findProfileGaps(natural).map((g) => g.path)).toContain('dimensions.handguard-height.max');
  });

  it('when the trade-practice values are read, then they match: 15 min interval, 2 waiting sleds, floors 0.0 / +1.0 °C, 0.5 mm feeler', () => {
    const natural = shippedProfile('natural', 'international');
    const artificial = shippedProfile('artificial', 'national');
    // trade practice, no published source
    expect(valueAt(natural, 'controlSteel.interval')?.value).toBe(15);
    expect(valueAt(natural, 'startArea.maxWaitingSleds')?.value).toBe(2);
    expect(valueAt(natural, 'temperature.floor')?.value).toBe(0);
    expect(valueAt(artificial, 'temperature.floor')?.value).toBe(10);
    expect(valueAt(artificial, 'gapProbe.feeler')?.value).toBe(5);
    expect(valueAt(artificial, 'controlSteel.mountedBeforeFirstStart')?.value).toBe(240);
    expect(valueAt(natural, 'temperature.margin')?.source.kind).toBe('trade-practice');
  });
});

describe('opening a competition freezes its profile', () => {
  const openedAt = new Date('2027-01-09T07:00:00Z');

  it('when a value is still unset, then the competition cannot open, and the error lists every gap by name', () => {
    const error = expectRulesError(() => freezeProfileForOpening(shippedProfile('artificial', 'international'), openedAt), 'profile-gap');
    expect(error.details).toEqual([
      'Control reading still usable after it is due for (controlSteel.grace)',
      'Share of the shortfall below the reference that may be added (weights.extraWeight.shareOfShortfall)',
      'Scale verification interval e (scale.division)',
      'Finish draw: weight of "no inspection" (finishPlan.drawWeights.none)',
      'Finish draw: weight of "re-measure" (finishPlan.drawWeights.remeasure)',
      'Finish draw: weight of "detailed check" (finishPlan.drawWeights.detailed)',
    ]);
  });

  it('when the organiser accepts the demo values, then they are labelled as demo values and the competition opens', () => {
    const demo = acceptDemoValues(shippedProfile('natural', 'international'));
    expect(findProfileGaps(demo)).toEqual([]);
    expect(valueAt(demo, 'weights.sledMax.doubles')?.source).toMatchObject({ kind: 'demo-value', verified: false });
    expect(valueAt(demo, 'temperature.margin')?.source.kind).toBe('trade-practice');
    expect(freezeProfileForOpening(demo, openedAt).frozenAt).toBe('2027-01-09T07:00:00.000Z');
  });

  it('when junior weights have no demo value either, then accepting demo values still leaves them as gaps', () => {
    const gaps = findProfileGaps(acceptDemoValues(shippedProfile('artificial', 'junior'))).map((g) => g.path);
    expect(gaps).toContain('weights.extraWeight.referenceBodyWeight.singles-men');
  });

  it('when the profile is edited after opening, then the frozen copy keeps the old value and cannot be changed', () => {
    const profile = acceptDemoValues(shippedProfile('artificial', 'international'));
    const frozen = freezeProfileForOpening(profile, openedAt);
    const edited = withProfileValue(profile, 'temperature.margin', 40, enteredByTest);
    profile.temperature.margin.value = 30;
    expect(valueAt(edited, 'temperature.margin')?.value).toBe(40);
    expect(frozen.profile.temperature.margin.value).toBe(50);
    expect(() => {
      (frozen.profile.temperature.margin as { value: number }).value = 10;
    }).toThrow(TypeError);
  });

  it('when a value is set to a fraction or at a path that does not exist, then it is refused', () => {
    const profile = shippedProfile('natural', 'international');
    expectRulesError(() => withProfileValue(profile, 'temperature.margin', 4.5, enteredByTest), 'invalid-input');
    expectRulesError(() => withProfileValue(profile, 'temperature.nonsense', 1, enteredByTest), 'invalid-input');
  });
});
