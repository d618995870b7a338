import { profileWith } from '../../../../shared/rules/test-profiles';
import type { TimedReading } from '../../../../shared/rules/temperature';
import {
  currentReadings,
  judgeSpots,
  meaningOfTap,
  missingReadings,
  nextPresetSpot,
  planOf,
  positionOf,
  presetPlan,
  spotName,
  type SpotReading,
} from './steel-spots';

// The grace after a control reading falls due ships unset; 2 min is this spec's own assumption.
// Margin +5.0 °C, natural floor 0.0 °C and the 15 min interval: trade practice, no published source.
const natural = profileWith('natural', 'international', { 'controlSteel.grace': 2 });
const control = (tenths: number, takenAt: string): TimedReading => ({ reading: { tenths, unit: 'celsius' }, takenAt });
const controls = [control(-49, '2027-01-09T09:00:00Z')];

const read = (steel: 'left' | 'right', spot: number, tenths: number, minute: number, replacesSpot?: number): SpotReading => ({
  steel,
  spot,
  tenths,
  takenAt: `2027-01-09T09:${String(minute).padStart(2, '0')}:00Z`,
  ...(replacesSpot === undefined ? {} : { replacesSpot }),
});
const spotsOf = (readings: readonly SpotReading[]) => readings.map((r) => `${r.steel}-${r.spot}:${r.tenths}`);

describe('steel spots', () => {
  it('when a spot is named, then it says the steel, the spot counted from 1 and from where', () => {
    expect(spotName({ steel: 'left', spot: 1 })).toBe('Left steel, spot 2 of 5, from the front');
    expect(spotName({ steel: 'right', spot: 4 })).toBe('Right steel, spot 5 of 5, from the front');
  });

  it('when a spot is read again, then the later reading counts, whatever order they arrive in', () => {
    const current = currentReadings([read('left', 1, -30, 3), read('left', 1, -40, 1), read('right', 3, -20, 2)]);
    expect(spotsOf(current)).toEqual(['left-1:-30', 'right-3:-20']);
  });

  it('when a third spot names the spot it replaces, then that one goes and the steel keeps two', () => {
    const current = currentReadings([read('left', 1, -30, 1), read('left', 3, -31, 2), read('left', 2, -32, 3, 3)]);
    expect(spotsOf(current)).toEqual(['left-1:-30', 'left-2:-32']);
  });

  it('when a third spot names no replacement, then the steel’s oldest reading gives way, never three on a steel', () => {
    const current = currentReadings([read('left', 1, -30, 1), read('left', 3, -31, 2), read('left', 2, -32, 3), read('right', 0, -10, 1)]);
    expect(spotsOf(current)).toEqual(['left-2:-32', 'left-3:-31', 'right-0:-10']);
  });

  it('when the same saved reading arrives twice, then it counts once', () => {
    const twice = read('right', 2, -5, 4, 0);
    expect(spotsOf(currentReadings([read('right', 0, -1, 1), read('right', 4, -2, 2), twice, twice]))).toEqual(['right-2:-5', 'right-4:-2']);
  });

  it('when a sled was read, then its plan lists the spots per steel front to rear', () => {
    expect(planOf([read('right', 3, 0, 1), read('left', 4, 0, 1), read('right', 1, 0, 1), read('left', 0, 0, 1)])).toEqual({ left: [0, 4], right: [1, 3] });
  });

  it('when the first sled has a plan, then it is the preset; with none, nothing is preset', () => {
    expect(presetPlan({ left: [3, 1], right: [0, 4] })).toEqual({ left: [1, 3], right: [0, 4] });
    expect(presetPlan(null)).toBeNull();
    expect(presetPlan({ left: [], right: [] })).toBeNull();
  });

  it('when a first-sled plan holds repeats or spots that do not exist, then only real spots are preset, two per steel at most', () => {
    expect(presetPlan({ left: [1, 1, 7, -1, 2.5], right: [0, 2, 4] })).toEqual({ left: [1], right: [0, 2] });
  });

  it('when preset spots are read one by one, then the next unread one is offered, left then right, front to rear', () => {
    const plan = { left: [1, 3], right: [0, 2] };
    expect(nextPresetSpot(plan, [])).toEqual({ steel: 'left', spot: 1 });
    expect(nextPresetSpot(plan, [{ steel: 'left', spot: 1 }, { steel: 'left', spot: 3 }])).toEqual({ steel: 'right', spot: 0 });
    expect(nextPresetSpot(plan, [{ steel: 'left', spot: 1 }, { steel: 'left', spot: 3 }, { steel: 'right', spot: 0 }, { steel: 'right', spot: 2 }])).toBeNull();
    expect(nextPresetSpot(null, [])).toBeNull();
  });

  it('when a steel has two readings, then the one nearer the front is "front" and the other "rear"; alone, a reading has no position yet', () => {
    const spots = [{ steel: 'left' as const, spot: 3 }, { steel: 'left' as const, spot: 1 }, { steel: 'right' as const, spot: 2 }];
    expect(positionOf(spots, spots[0]!)).toBe('left-rear');
    expect(positionOf(spots, spots[1]!)).toBe('left-front');
    expect(positionOf(spots, spots[2]!)).toBeNull();
  });

  it('when a steel already has two spots read, then a tap on a third asks which to replace; a tap on a read spot reads it again', () => {
    const readings = [{ steel: 'left' as const, spot: 1 }, { steel: 'left' as const, spot: 3 }];
    expect(meaningOfTap(readings, { steel: 'left', spot: 2 })).toEqual({ kind: 'ask-replace', readSpots: [1, 3] });
    expect(meaningOfTap(readings, { steel: 'left', spot: 3 })).toEqual({ kind: 'read' });
    expect(meaningOfTap(readings, { steel: 'right', spot: 2 })).toEqual({ kind: 'read' });
    expect(missingReadings(readings)).toEqual({ left: 0, right: 2 });
  });
});

describe('judging the spots', () => {
  it('when one of four readings is over the limit, then the sled fails and each spot keeps its position and verdict', () => {
    // trade practice, no published source: natural, control −4.9 °C → limit +0.1 °C
    const judgement = judgeSpots(natural, controls, [read('left', 1, -10, 2), read('left', 3, 0, 2), read('right', 0, 2, 3), read('right', 4, 1, 3)]);
    if (judgement.kind !== 'judged') throw new Error(judgement.problem);
    expect(judgement.outcome).toBe('fail');
    expect(judgement.spots.map((s) => [s.position, s.verdict.outcome])).toEqual([
      ['left-front', 'pass'],
      ['left-rear', 'pass'],
      ['right-front', 'fail'],
      ['right-rear', 'pass'],
    ]);
    expect(judgement.spots[2]!.verdict.reason).toBe('Steel +0.2 °C is 0.1 °C over the limit of +0.1 °C.');
  });

  it('when the control reading is older than the interval and grace, then every spot is not judged, never a pass', () => {
    const judgement = judgeSpots(natural, controls, [read('left', 1, -100, 18)]);
    if (judgement.kind !== 'judged') throw new Error(judgement.problem);
    expect(judgement.outcome).toBe('not-judged');
    expect(judgement.spots[0]!.verdict.reason).toMatch(/^Control reading overdue/);
  });

  it('when the profile has a gap the engine needs, then it cannot judge and says why in words', () => {
    const gappy = profileWith('natural', 'international');
    const judgement = judgeSpots(gappy, controls, [read('left', 1, -100, 2)]);
    expect(judgement).toEqual({ kind: 'cannot-judge', problem: expect.stringContaining('The rules profile has no value for') });
  });
});
