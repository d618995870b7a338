import { describe, expect, it } from 'vitest';
import { controlSteelStatus, judgeControlSteelMounting } from './control-steel';
import { expectRulesError } from './expect-rules-error';
import { measurement } from './measurement';
import { profileWith } from './test-profiles';

// The grace ships unset; 2 min is this test's own assumption.
const natural = profileWith('natural', 'international', { 'controlSteel.grace': 2 });
const artificial = profileWith('artificial', 'international', { 'controlSteel.grace': 2 });
const reading = (takenAt: string) => ({ reading: measurement(-62, 'celsius'), takenAt });

describe('when the next control steel reading is due', () => {
  const readings = [reading('2027-01-09T09:00:00Z'), reading('2027-01-09T09:15:00Z')];
  const at = (iso: string) => controlSteelStatus(natural, readings, new Date(iso));

  it('when nothing has been read yet, then it says so and names no due time', () => {
    const status = controlSteelStatus(natural, [], new Date('2027-01-09T09:00:00Z'));
    expect(status.state).toBe('no-reading-yet');
    expect(status.dueAt).toBeUndefined();
  });

  it('when 14 min 59 s have passed since the last reading, then it is on time with one second to go', () => {
    // trade practice, no published source: a reading every 15 min
    const status = at('2027-01-09T09:29:59Z');
    expect(status.state).toBe('on-time');
    expect(status.msUntilDue).toBe(1000);
    expect(status.dueAt).toBe('2027-01-09T09:30:00.000Z');
  });

  it('when exactly 15 min have passed, then it is due now, and stays due now through the grace', () => {
    expect(at('2027-01-09T09:30:00Z').state).toBe('due-now');
    expect(at('2027-01-09T09:32:00Z').state).toBe('due-now');
  });

  it('when the grace has run out, then it is overdue with a negative time until due', () => {
    const status = at('2027-01-09T09:32:01Z');
    expect(status.state).toBe('overdue');
    expect(status.msUntilDue).toBe(-121_000);
  });

  it('when a reading carries a time after now (a device clock ahead), then it is not counted yet', () => {
    expect(at('2027-01-09T09:14:00Z').last?.takenAt).toBe('2027-01-09T09:00:00Z');
  });
});

describe('control steel mounting checklist', () => {
  const firstStartAt = '2027-01-09T10:00:00Z';

  it('when a natural-track control steel hangs 50.0 to 100.0 cm high, in the shade, 30 min before the start, then it passes', () => {
    // trade practice, no published source: 0.5 m to 1.0 m above ground, in shade, from ≥ 30 min before the first start
    for (const height of [500, 1000]) {
      const result = judgeControlSteelMounting(natural, {
        height: measurement(height, 'centimetre'),
        inShade: true,
        mountedAt: '2027-01-09T09:30:00Z',
        firstStartAt,
      });
      expect(result.outcome).toBe('pass');
    }
  });

  it('when it hangs 49.9 cm or 100.1 cm high, or 29 min before the start, then it fails and says what is wrong', () => {
    // trade practice, no published source: 0.5 m to 1.0 m, ≥ 30 min
    const low = judgeControlSteelMounting(natural, { height: measurement(499, 'centimetre'), inShade: true, mountedAt: '2027-01-09T09:30:00Z', firstStartAt });
    const high = judgeControlSteelMounting(natural, { height: measurement(1001, 'centimetre'), inShade: true, mountedAt: '2027-01-09T09:30:00Z', firstStartAt });
    const late = judgeControlSteelMounting(natural, { height: measurement(700, 'centimetre'), inShade: true, mountedAt: '2027-01-09T09:31:00Z', firstStartAt });
    expect(low.outcome).toBe('fail');
    expect(low.reason).toBe('The control steel is mounted 49.9 cm high, lower than 50.0 cm.');
    expect(high.reason).toBe('The control steel is mounted 100.1 cm high, higher than 100.0 cm.');
    expect(late.reason).toBe('The control steel is mounted 29 min before the first start, less than 30 min.');
  });

  it('when an artificial-track control steel is 20.0 cm long, shaded, out of drafts and mounted 4 h before, then it passes; 19.9 cm or a draft fails', () => {
    // trade practice, no published source: ≥ 20 cm long, in shade, away from drafts, mounted ≥ 4 h before the start
    const ok = { length: measurement(200, 'centimetre'), inShade: true, awayFromDrafts: true, mountedAt: '2027-01-09T06:00:00Z', firstStartAt };
    expect(judgeControlSteelMounting(artificial, ok).outcome).toBe('pass');
    expect(judgeControlSteelMounting(artificial, { ...ok, length: measurement(199, 'centimetre') }).outcome).toBe('fail');
    const drafty = judgeControlSteelMounting(artificial, { ...ok, awayFromDrafts: false, inShade: false });
    expect(drafty.reason).toBe('The control steel is not in the shade; in a draft.');
    expect(judgeControlSteelMounting(artificial, { ...ok, mountedAt: '2027-01-09T06:01:00Z' }).outcome).toBe('fail');
  });

  it('when the height is missing on natural track or the draft question unanswered on artificial, then it refuses', () => {
    expectRulesError(() => judgeControlSteelMounting(natural, { inShade: true, mountedAt: '2027-01-09T09:00:00Z', firstStartAt }), 'missing-value');
    expectRulesError(
      () => judgeControlSteelMounting(artificial, { length: measurement(250, 'centimetre'), inShade: true, mountedAt: '2027-01-09T05:00:00Z', firstStartAt }),
      'missing-value',
    );
  });
});
