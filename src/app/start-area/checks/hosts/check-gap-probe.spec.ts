// First: Dexie reads the global indexedDB once when it loads (each store still gets its own factory).
import 'fake-indexeddb/auto';
import { profileWith } from '../../../../../shared/rules/test-profiles';
import { anotherOfficials, checkFieldsOf, checkTime, entry, expired, issued, openStep, untilStored, until } from './testing/check-page-harness';

// Artificial track, senior. The gap probe ships as trade practice: a 0.5 mm feeler; entering up to half the
// steel width goes to the technical delegate with extra finish inspections. So do the control weights at the
// scale: at least five of at least 20.0 kg each. No value this step uses is unset.
const artificial = profileWith('artificial', 'international');

const probe = issued(501, 'gap-probe', 'GAP-21');
const othersProbe = anotherOfficials(502, 'gap-probe', 'GAP-22');
const expiredProbe = expired(503, 'gap-probe', 'GAP-23');
// Five 20.0 kg control weights at the scale (this spec's own masses, at the trade-practice minimum), so the scale
// proof waits for a reading instead of going to the delegate for want of weights.
const controlWeights = [1, 2, 3, 4, 5].map((n) => issued(510 + n, 'control-weight', `CWT-2${n}`, { nominalMass: 200 }));

const openGapProbe = () =>
  openStep({ profile: artificial, startList: [entry(7)], instruments: [probe, othersProbe, expiredProbe, ...controlWeights] }, 'gap-probe');
const upToHalf = 'button[data-result="enters-up-to-half"]';

describe('CheckGapProbe on the check page', () => {
  it('the trade-practice values the verdict below is worked out from', () => {
    expect(artificial.gapProbe?.feeler.value).toBe(5);
    expect(artificial.gapProbe?.feeler.source.kind).toBe('trade-practice');
    expect([artificial.scale.controlWeightMin.value, artificial.scale.controlWeightMinCount.value]).toEqual([200, 5]);
  });

  it('when no gap probe is chosen, then only the official’s calibrated probe is offered and no result can be given', async () => {
    const { store, page, id } = await openGapProbe();
    expect(page.all('[data-section="gap-probe"] button[data-instrument]').map((b) => b.getAttribute('data-instrument'))).toEqual(['GAP-21']);
    expect(page.refusedIn('gap-probe')).toEqual([
      ['GAP-22', '✕ GAP-22 is assigned to another official.'],
      ['GAP-23', '✕ GAP-23 was calibrated until 2027-01-08; use a calibrated instrument.'],
    ]);

    expect(page.find(upToHalf)?.matches(':disabled')).toBe(true);
    page.click(upToHalf);
    expect(page.text('[data-section="chosen"]')).toBe('Nothing chosen yet.');
    expect((await checkFieldsOf(store, id))['gapProbe']).toBeNull();
    expect(page.summaryOf('gap-probe')).toBe('waiting');
  });

  it('when the feeler enters up to half the steel width, then the result is saved with the probe and the check goes first to the technical delegate, with the reason', async () => {
    const { store, page, id } = await openGapProbe();
    expect(page.text('[data-section="check-result"]')).toContain('◌ Still to do');

    page.pickInstrument('gap-probe', 'GAP-21');
    page.click(upToHalf);

    const fields = await untilStored(() => checkFieldsOf(store, id), (f) => f['gapProbe'] !== null, 'the result is saved');
    expect(fields['gapProbe']).toEqual({ result: 'enters-up-to-half', instrumentId: probe.id, takenAt: checkTime });
    await until(() => page.text().includes('Enters up to half the steel width: saved on this device'), 'the save is confirmed');

    // Up to half with the 0.5 mm feeler: the engine refers the sled to the delegate; it is not a violation.
    const reason = 'The 0.5 mm feeler enters the joint up to half the steel width: tell the technical delegate; this sled gets extra finish inspections.';
    await until(() => page.summaryOf('gap-probe') === 'refer', 'the step goes to the delegate');
    expect(page.text('button[data-step="gap-probe"]')).toContain('⚑ for the delegate');
    expect(page.text('[data-section="check-result"]')).toContain('⚑ For the technical delegate.');
    // The only step for the delegate: the others are still to do.
    expect(page.all('[data-unsure-step]').map((li) => li.textContent?.replace(/\s+/g, ' ').trim())).toEqual([`Gap probe: ${reason}`]);
    const results = page.all('[data-section="check-result"] + .results button');
    expect(results[0]?.textContent?.trim()).toBe('⚑ Refer to the technical delegate');
    expect(results[0]?.classList).toContain('primary-action');
    expect(page.buttons()).not.toContain('⚠ Report the violation');
  });
});
