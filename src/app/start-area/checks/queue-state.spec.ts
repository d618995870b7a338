import type { StartListEntry } from '../../../../shared/competition/start-list';
import { profileWith } from '../../../../shared/rules/test-profiles';
import type { CheckRow, CheckStatus } from './check-words';
import { queueStateWords, startQueue } from './queue-state';

// Invented athletes. The waiting limits below are the tests' own assumptions, set with profileWith, not rule values.
const atMostTwo = profileWith('natural', 'national', { 'startArea.maxWaitingSleds': 2 });
const atMostThree = profileWith('natural', 'national', { 'startArea.maxWaitingSleds': 3 });

const startList: StartListEntry[] = [
  { bib: 4, startOrder: 3, discipline: 'doubles', athlete: 'Cy Example', secondAthlete: 'Di Example', officialBodyWeight: null, secondOfficialBodyWeight: null },
  { bib: 9, startOrder: 1, discipline: 'singles-women', athlete: 'Ann Example', secondAthlete: null, officialBodyWeight: null, secondOfficialBodyWeight: null },
  { bib: 2, startOrder: 2, discipline: 'singles-men', athlete: 'Bo Example', secondAthlete: null, officialBodyWeight: null, secondOfficialBodyWeight: null },
  { bib: 7, startOrder: 4, discipline: 'singles-men', athlete: 'Ed Example', secondAthlete: null, officialBodyWeight: null, secondOfficialBodyWeight: null },
];

let made = 0;
function check(bib: number, status: CheckStatus, extra: Partial<CheckRow> = {}): CheckRow {
  made++;
  return { id: `check-${made}`, run: 1, bib, sled: 1, status, beganAt: `2027-01-09T09:${String(10 + made).padStart(2, '0')}:00.000Z`, startedAt: null, note: '', onlyHere: true, ...extra };
}

const hhmm = (iso: string) => iso.slice(11, 16);

describe('startQueue', () => {
  it('when nothing is checked yet, then the sleds are in start order, all to check, and the first in start order is next', () => {
    const queue = startQueue({ startList, checks: [], profile: atMostTwo });
    expect(queue.entries.map((e) => [e.bib, e.startOrder, e.state])).toEqual([
      [9, 1, 'to-check'],
      [2, 2, 'to-check'],
      [4, 3, 'to-check'],
      [7, 4, 'to-check'],
    ]);
    expect(queue.next?.bib).toBe(9);
    expect(queue.entries[2]).toMatchObject({ athletes: 'Cy Example / Di Example', discipline: 'Doubles', check: null });
    expect(queue.waiting).toBe(0);
    expect(queue.mayBegin.allowed).toBe(true);
  });

  it('when sleds are checked, then each shows its state and the next is the first still to check in start order', () => {
    const checks = [
      check(9, 'cleared', { startedAt: '2027-01-09T09:40:00.000Z' }),
      check(2, 'referred'),
      check(7, 'in-progress'),
    ];
    const queue = startQueue({ startList, checks, profile: atMostTwo });
    expect(queue.entries.map((e) => [e.bib, e.state])).toEqual([
      [9, 'started'],
      [2, 'referred'],
      [4, 'to-check'],
      [7, 'under-way'],
    ]);
    expect(queue.next?.bib).toBe(4);
  });

  it('when every state occurs, then each is said in words with a mark, times on the device clock', () => {
    const words = (state: CheckStatus, extra: Partial<CheckRow> = {}) => {
      const row = check(1, state, { beganAt: '2027-01-09T09:30:00.000Z', ...extra });
      const [entry] = startQueue({ startList: [], checks: [row], profile: atMostTwo }).entries;
      return queueStateWords(entry!, hhmm);
    };
    expect(queueStateWords({ state: 'to-check', check: null }, hhmm)).toBe('○ To check');
    expect(words('in-progress')).toBe('… Check under way (closed to preparation since 09:30)');
    expect(words('cleared')).toBe('✓ Cleared, waiting at the start');
    expect(words('cleared', { startedAt: '2027-01-09T09:41:00.000Z' })).toBe('→ Started at 09:41');
    expect(words('referred')).toBe('⚑ Referred to the technical delegate, waiting at the start');
    expect(words('referred', { startedAt: '2027-01-09T09:42:00.000Z' })).toBe('→ Started at 09:42');
    expect(words('violation')).toBe('⚠ Violation reported');
    expect(words('withdrawn')).toBe('✕ Withdrawn');
  });

  it('when sleds are cleared and not started, then they count as waiting; checks under way, started and violation sleds do not', () => {
    const checks = [
      check(9, 'cleared'),
      check(2, 'in-progress'),
      check(4, 'cleared', { startedAt: '2027-01-09T09:40:00.000Z' }),
      check(7, 'violation'),
    ];
    const queue = startQueue({ startList, checks, profile: atMostTwo });
    expect(queue.waiting).toBe(1);
    expect(queue.mayBegin).toMatchObject({ allowed: true, reason: 'One controlled sled is waiting (at most 2 at once): this sled may be checked.' });
  });

  it('when a sled is referred to the delegate and has not started, then it waits at the start and takes a place', () => {
    const referred = startQueue({ startList, checks: [check(9, 'cleared'), check(2, 'referred')], profile: atMostTwo });
    expect(referred.waiting).toBe(2);
    expect(referred.mayBegin.allowed).toBe(false);
    const started = startQueue({ startList, checks: [check(9, 'cleared'), check(2, 'referred', { startedAt: '2027-01-09T09:41:00.000Z' })], profile: atMostTwo });
    expect(started.waiting).toBe(1);
    expect(started.entries.find((e) => e.bib === 2)?.state).toBe('started');
  });

  it('when as many sleds wait as the rules allow, then no check may begin and the engine says why', () => {
    const queue = startQueue({ startList, checks: [check(9, 'cleared'), check(2, 'cleared')], profile: atMostTwo });
    expect(queue.waiting).toBe(2);
    expect(queue.mayBegin.allowed).toBe(false);
    expect(queue.mayBegin.reason).toBe('Two controlled sleds are already waiting; check the next sled when one has started.');
    expect(queue.mayBegin.verdict?.outcome).toBe('fail');
    expect(queue.mayBegin.verdict?.used[0]).toMatchObject({ path: 'startArea.maxWaitingSleds', value: 2 });
  });

  it('when the rules allow more waiting sleds, then the limit is the profile’s and not a number in the app', () => {
    const queue = startQueue({ startList, checks: [check(9, 'cleared'), check(2, 'cleared')], profile: atMostThree });
    expect(queue.mayBegin.allowed).toBe(true);
    expect(queue.mayBegin.reason).toContain('at most 3 at once');
  });

  it('when a sled not on the start list was checked in the run, then it is listed after the start list and counts as waiting', () => {
    const queue = startQueue({ startList, checks: [check(55, 'cleared'), check(9, 'cleared')], profile: atMostTwo });
    expect(queue.entries.map((e) => [e.bib, e.startOrder, e.athletes, e.state]).at(-1)).toEqual([55, null, null, 'waiting']);
    expect(queue.waiting).toBe(2);
    expect(queue.mayBegin.allowed).toBe(false);
  });

  it('when an athlete presented a second sled, then the row shows the newer check and both sleds count', () => {
    const first = check(9, 'cleared', { sled: 1, beganAt: '2027-01-09T09:20:00.000Z' });
    const second = check(9, 'cleared', { sled: 2, beganAt: '2027-01-09T09:25:00.000Z' });
    const queue = startQueue({ startList, checks: [second, first], profile: atMostTwo });
    expect(queue.entries[0]?.check?.id).toBe(second.id);
    expect(queue.waiting).toBe(2);
  });

  it('when the rules are not on the device, then a check may begin but the official is told the app could not count for them', () => {
    const queue = startQueue({ startList: [], checks: [check(9, 'cleared'), check(2, 'cleared')], profile: null });
    expect(queue.mayBegin).toEqual({
      allowed: true,
      verdict: null,
      reason: 'The competition’s rules are not on this device yet, so the app cannot say how many checked sleds may wait: count them before you begin.',
    });
    expect(queue.next).toBeNull();
  });

  it('when the competition is not open yet, then a check may begin and the official is told its rules are not fixed', () => {
    const queue = startQueue({ startList, checks: [], profile: 'not-open' });
    expect(queue.mayBegin.allowed).toBe(true);
    expect(queue.mayBegin.verdict).toBeNull();
    expect(queue.mayBegin.reason).toBe(
      'The competition is not open yet and its rules are not fixed, so the app cannot say how many checked sleds may wait: count them before you begin.',
    );
  });

  it('when the rules have no waiting limit, then the gap is named and no verdict is made up', () => {
    const gap = structuredClone(atMostTwo);
    gap.startArea.maxWaitingSleds.value = null;
    const queue = startQueue({ startList, checks: [], profile: gap });
    expect(queue.mayBegin.verdict).toBeNull();
    expect(queue.mayBegin.reason).toContain('The rules profile has no value for');
    expect(queue.mayBegin.reason).toContain('Count the checked sleds waiting before you begin.');
  });
});
