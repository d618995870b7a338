// First: Dexie reads the global indexedDB once when it loads (each store still gets its own factory).
import 'fake-indexeddb/auto';
import { acceptDemoValues } from '../../../../../shared/rules/profile-values';
import { shippedProfile } from '../../../../../shared/rules/shipped-profiles';
import {
  anotherOfficials,
  checkTime,
  entry,
  expired,
  issued,
  openCheck,
  openStep,
  recordsOf,
  startCheck,
  until,
  untilSaved,
  type CheckPage,
  type CheckPageSetUp,
} from './testing/check-page-harness';

// Natural track. The scale values ship set: a control weight of at least 1.0 kg, at least one of them (trade
// practice; the 1 kg also in a published national rule text), a scale interval e of 100 g (published national
// rule text), in-service tolerances. The demo values only fill the profile's other gaps so it can open.
const natural = acceptDemoValues(shippedProfile('natural', 'international'));

const scale = issued(301, 'scale', 'SCL-05');
// Certified masses are this spec's own: 5.0 kg and 2.0 kg, both over the 1.0 kg minimum.
const fiveKg = issued(302, 'control-weight', 'CWT-08', { nominalMass: 50 });
const twoKg = issued(303, 'control-weight', 'CWT-09', { nominalMass: 20 });
const othersWeight = anotherOfficials(304, 'control-weight', 'CWT-10', { nominalMass: 50 });
const expiredWeight = expired(305, 'control-weight', 'CWT-11', { nominalMass: 50 });

const setUp: CheckPageSetUp = {
  profile: natural,
  startList: [entry(7), entry(8)],
  instruments: [scale, anotherOfficials(306, 'scale', 'SCL-06'), fiveKg, twoKg, othersWeight, expiredWeight],
};

// Tolerance, OIML R 76-1 class III (from memory): up to 500 e (50 kg at e = 100 g) ±0.5 e, doubled in service:
// ±1 e = ±100 g for every load below. So 7.0 kg on the scale may read 6.9 to 7.1 kg.
const readingPad = 'rl-scale-proof-step rl-glove-keypad';

async function prove(page: CheckPage, ...keys: string[]) {
  page.keyAndSave(readingPad, ...keys);
  const [whole, tenth] = keys.join('').split('.');
  await untilSaved(page, `Scale proof (${whole}.${tenth ?? '0'} kg)`);
}

describe('CheckScaleProof on the check page', () => {
  it('when the scale is proved with the official’s control weights, then a scale proof of this run and check is saved and passes', async () => {
    const { store, page, id } = await openStep(setUp, 'scale-proof');
    // Nothing to key before a scale is chosen.
    expect(page.has('rl-scale-proof-step')).toBe(false);
    page.pickInstrument('scale', 'SCL-05');

    // Only the calibrated control weights issued to this official are at the scale, all on it at first.
    expect(page.all('button[data-weight]').map((b) => b.getAttribute('data-weight'))).toEqual(['CWT-08', 'CWT-09']);
    expect(page.text('[data-section="known"]')).toBe('Known total on the scale: 7.0 kg');
    await prove(page, '7');

    const [proof, ...others] = await recordsOf(store, 'scale-proof');
    expect(others).toEqual([]);
    expect(proof?.fields).toEqual({
      run: 1,
      scaleId: scale.id,
      controlWeightIds: [fiveKg.id, twoKg.id],
      knownWeight: { tenths: 70, unit: 'kilogram' },
      reading: { tenths: 70, unit: 'kilogram' },
      takenAt: checkTime,
      checkId: id,
      supersedes: null,
      reason: null,
    });
    await until(() => page.summaryOf('scale-proof') === 'pass', 'the scale is proved');
    expect(page.text('[data-section="reading-verdict"]')).toContain('The scale reads 7.0 kg for the 7.0 kg weight: error 0 g, within ±100 g (±1 e).');
  });

  it('when the scale is proved again in the same check, then the new proof corrects the first with the reason "proved again"', async () => {
    const { store, page } = await openStep(setUp, 'scale-proof');
    page.pickInstrument('scale', 'SCL-05');
    await prove(page, '7');
    await until(() => page.summaryOf('scale-proof') === 'pass', 'the first proof is judged');

    // Only the 5.0 kg weight on the scale this time; 5.1 kg is 100 g over, the edge of ±100 g.
    page.click('button[data-weight="CWT-09"]');
    expect(page.text('[data-section="known"]')).toBe('Known total on the scale: 5.0 kg');
    await prove(page, '5', '.', '1');

    const proofs = await recordsOf(store, 'scale-proof');
    expect(proofs).toHaveLength(2);
    const first = proofs.find((p) => p.supersedes === null)!;
    const again = proofs.find((p) => p.supersedes === first.id)!;
    expect(again.fields).toMatchObject({
      run: 1,
      scaleId: scale.id,
      controlWeightIds: [fiveKg.id],
      knownWeight: { tenths: 50, unit: 'kilogram' },
      reading: { tenths: 51, unit: 'kilogram' },
      reason: 'proved again',
    });
    await until(() => page.text('[data-section="reading-verdict"]').includes('error +100 g, within ±100 g'), 'the correction is judged');
    expect(page.summaryOf('scale-proof')).toBe('pass');
  });

  it('once the run’s scale is proved in another check, then a new check of that run no longer lists the step, and a check of the next run does', async () => {
    const store = await (async () => {
      const opened = await openStep(setUp, 'scale-proof');
      opened.page.pickInstrument('scale', 'SCL-05');
      await prove(opened.page, '7');
      await until(() => opened.page.summaryOf('scale-proof') === 'pass', 'the scale is proved');
      // The check it was proved in keeps the step, so it never vanishes mid-check.
      expect(opened.page.listedSteps()).toContain('scale-proof');
      opened.page.fixture.destroy();
      return opened.store;
    })();

    const sameRun = await openCheck(store, startCheck(8));
    expect(sameRun.page.listedSteps()).toEqual(['equipment', 'weight', 'dimensions', 'steel']);
    sameRun.page.fixture.destroy();

    const nextRun = await openCheck(store, { ...startCheck(7), run: 2 });
    expect(nextRun.page.listedSteps()).toEqual(['equipment', 'scale-proof', 'weight', 'dimensions', 'steel']);
    expect(nextRun.page.summaryOf('scale-proof')).toBe('waiting');
  });

  it('when the scale reads outside its tolerance, then the proof is saved, goes to the technical delegate, and the next check of the run must prove the scale again', async () => {
    const { store, page } = await openStep(setUp, 'scale-proof');
    page.pickInstrument('scale', 'SCL-05');
    // 7.2 kg for 7.0 kg: error +200 g, outside ±100 g.
    await prove(page, '7', '.', '2');

    expect((await recordsOf(store, 'scale-proof'))[0]?.fields['reading']).toEqual({ tenths: 72, unit: 'kilogram' });
    await until(() => page.summaryOf('scale-proof') === 'fail', 'the proof fails');
    expect(page.text('[data-section="reading-verdict"]')).toContain('error +200 g, outside ±100 g (±1 e). Do not weigh with this scale');
    // A scale that fails its proof is not the athlete's violation: it goes to the delegate.
    expect(page.text('[data-unsure-step="scale-proof"]')).toBe('Prove the scale: The scale is not proved for this run: weigh only on a proved scale.');
    expect(page.buttons()).not.toContain('⚠ Report the violation');
    page.fixture.destroy();

    const next = await openCheck(store, startCheck(8));
    expect(next.page.listedSteps()).toContain('scale-proof');
    expect(next.page.summaryOf('scale-proof')).toBe('fail');
  });
});
