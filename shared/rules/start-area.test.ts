import { describe, expect, it } from 'vitest';
import { shippedProfile } from './shipped-profiles';
import { judgePreparation, judgeWaitingSleds } from './start-area';
import { thrownBy } from './expect-rules-error';

const natural = shippedProfile('natural', 'international');
const artificial = shippedProfile('artificial', 'international');

describe('judgeWaitingSleds', () => {
  it('when no controlled sled is waiting, then the next sled may be checked', () => {
    const result = judgeWaitingSleds({ profile: natural, waitingControlledSleds: 0 });
    expect(result.check).toBe('start-area-waiting');
    expect(result.outcome).toBe('pass');
  });

  it('when one controlled sled is waiting, then one more may be checked', () => {
    // at most 2 waiting: trade practice, no published source
    expect(judgeWaitingSleds({ profile: natural, waitingControlledSleds: 1 }).outcome).toBe('pass');
    expect(judgeWaitingSleds({ profile: artificial, waitingControlledSleds: 1 }).outcome).toBe('pass');
  });

  it('when two controlled sleds are waiting, then the next check waits until one has started', () => {
    // at most 2 waiting: trade practice, no published source
    const result = judgeWaitingSleds({ profile: artificial, waitingControlledSleds: 2 });
    expect(result.outcome).toBe('fail');
    expect(result.reason).toBe('Two controlled sleds are already waiting; check the next sled when one has started');
  });

  it('when more sleds wait than allowed, then it fails and says the most allowed', () => {
    const result = judgeWaitingSleds({ profile: natural, waitingControlledSleds: 3 });
    expect(result.outcome).toBe('fail');
    expect(result.reason).toContain('(at most 2 may wait at once)');
  });

  it('when judged, then the profile value used is recorded with its source and shown', () => {
    const result = judgeWaitingSleds({ profile: natural, waitingControlledSleds: 1 });
    expect(result.used.map((used) => [used.path, used.value, used.source.kind])).toEqual([['startArea.maxWaitingSleds', 2, 'trade-practice']]);
    expect(result.numbers).toEqual([
      { label: 'Controlled sleds waiting', text: '1' },
      { label: 'At most waiting at once', text: '2' },
    ]);
  });

  it.each([-1, 1.5, Number.NaN])('when the waiting count is %s, then it is refused', (count) => {
    expect(thrownBy(() => judgeWaitingSleds({ profile: natural, waitingControlledSleds: count })).code).toBe('invalid-input');
  });
});

describe('judgePreparation', () => {
  const checkBegunAt = '2027-01-09T10:15:00.000Z';

  it('when the sled was worked on one millisecond before the check began, then it passes', () => {
    const result = judgePreparation({ checkBegunAt, preparationAt: '2027-01-09T10:14:59.999Z' });
    expect(result.check).toBe('start-area-preparation');
    expect(result.outcome).toBe('pass');
  });

  it('when the sled was worked on one millisecond after the check began, then it fails', () => {
    // trade practice, no published source: no work on the sled once its check has begun
    expect(judgePreparation({ checkBegunAt, preparationAt: '2027-01-09T10:15:00.001Z' }).outcome).toBe('fail');
  });

  it('when the work happened at the very moment the check began, then it counts as after and fails', () => {
    const result = judgePreparation({ checkBegunAt, preparationAt: checkBegunAt });
    expect(result.outcome).toBe('fail');
    expect(result.steps).toEqual(['Work at the same moment as the start of the check counts as after it.']);
  });

  it('when the times carry different time zones, then they are compared as the same instant', () => {
    // 11:14 at +01:00 is 10:14 UTC, before the check; as local text it would look later.
    expect(judgePreparation({ checkBegunAt, preparationAt: '2027-01-09T11:14:00+01:00' }).outcome).toBe('pass');
    expect(judgePreparation({ checkBegunAt, preparationAt: '2027-01-09T11:16:00+01:00' }).outcome).toBe('fail');
  });

  it('when judged, then both times are shown in UTC', () => {
    expect(judgePreparation({ checkBegunAt, preparationAt: '2027-01-09T11:14:00+01:00' }).numbers).toEqual([
      { label: 'Check began (UTC)', text: '2027-01-09T10:15:00.000Z' },
      { label: 'Work on the sled (UTC)', text: '2027-01-09T10:14:00.000Z' },
    ]);
  });

  it.each(['yesterday', '2027-02-30T10:00:00Z', '2027-01-09T10:00:00', ''])('when a time is %j, then it is refused', (bad) => {
    expect(thrownBy(() => judgePreparation({ checkBegunAt, preparationAt: bad })).code).toBe('invalid-input');
    expect(thrownBy(() => judgePreparation({ checkBegunAt: bad, preparationAt: checkBegunAt })).code).toBe('invalid-input');
  });
});
