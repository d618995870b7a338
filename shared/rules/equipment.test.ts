import { describe, expect, it } from 'vitest';
import { judgeEquipment } from './equipment';
import type { RulesProfile } from './rules-profile';
import { shippedProfile } from './shipped-profiles';
import { thrownBy } from './expect-rules-error';

const natural = shippedProfile('natural', 'international');
const artificial = shippedProfile('artificial', 'international');

const allPresent = (profile: RulesProfile) => Object.fromEntries(profile.equipment.map((item) => [item.id, true]));

describe('equipment lists', () => {
  it('when the natural profile is shipped, then it lists the natural-track safety equipment and the bib', () => {
    // trade practice, no published source: gloves, helmet, braking shoes, ankle braces, attachment releasing
    // by itself in a crash; the bib is checked on both track types
    expect(natural.equipment.map((item) => item.id)).toEqual([
      'gloves',
      'helmet',
      'braking-shoes',
      'ankle-braces',
      'attachment-releases',
      'bib-fixed',
    ]);
  });

  it('when the artificial profile is shipped, then it lists the race equipment and the bib', () => {
    // trade practice, no published source
    expect(artificial.equipment.map((item) => item.id)).toEqual(['race-equipment', 'bib-fixed']);
  });
});

describe('judgeEquipment', () => {
  it('when every natural-track item is confirmed present, then it passes', () => {
    const result = judgeEquipment({ profile: natural, present: allPresent(natural) });
    expect(result.check).toBe('equipment');
    expect(result.outcome).toBe('pass');
    expect(result.numbers).toEqual([{ label: 'Confirmed present', text: '6 of 6' }]);
  });

  it('when the helmet is missing, then the athlete does not start', () => {
    const result = judgeEquipment({ profile: natural, present: { ...allPresent(natural), helmet: false } });
    expect(result.outcome).toBe('fail');
    expect(result.reason).toBe('No start without safety equipment: missing Helmet');
    expect(result.numbers).toEqual([{ label: 'Confirmed present', text: '5 of 6' }]);
  });

  it('when several items are missing, then all of them are named', () => {
    const result = judgeEquipment({ profile: natural, present: { ...allPresent(natural), gloves: false, 'ankle-braces': false } });
    expect(result.reason).toBe('No start without safety equipment: missing Gloves, Ankle braces');
  });

  it('when the attachment would not release by itself in a crash, then the athlete does not start', () => {
    // trade practice, no published source
    const result = judgeEquipment({ profile: natural, present: { ...allPresent(natural), 'attachment-releases': false } });
    expect(result.outcome).toBe('fail');
  });

  it('when the bib is not fixed on artificial track, then it fails', () => {
    const result = judgeEquipment({ profile: artificial, present: { 'race-equipment': true, 'bib-fixed': false } });
    expect(result.outcome).toBe('fail');
    expect(result.reason).toBe('No start without safety equipment: missing Start-number bib fixed');
  });

  it('when an item has not been marked at all, then it is a missing value naming the item', () => {
    const { 'braking-shoes': _unmarked, ...rest } = allPresent(natural);
    const error = thrownBy(() => judgeEquipment({ profile: natural, present: rest }));
    expect(error.code).toBe('missing-value');
    expect(error.message).toContain('Braking shoes');
    expect(error.details).toEqual(['braking-shoes']);
  });

  it('when an item from the other track type is marked, then it is refused', () => {
    const error = thrownBy(() => judgeEquipment({ profile: artificial, present: { ...allPresent(artificial), helmet: true } }));
    expect(error.code).toBe('invalid-input');
  });
});
