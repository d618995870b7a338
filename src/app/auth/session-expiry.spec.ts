import { describeSessionExpiry } from './session-expiry';

const now = new Date('2027-01-09T08:00:00Z');
const inMinutes = (minutes: number) => new Date(now.getTime() + minutes * 60_000);

describe('describeSessionExpiry', () => {
  it('when more than two hours remain, then nothing is said', () => {
    expect(describeSessionExpiry(inMinutes(121), now).kind).toBe('fine');
  });

  it('when less than two hours remain, then it says how long in words', () => {
    const expiry = describeSessionExpiry(inMinutes(100), now);
    expect(expiry.kind).toBe('ending-soon');
    expect(expiry.kind !== 'fine' && expiry.text).toContain('in 1 h 40 min');
  });

  it('when the session has ended, then it says records stay on the device', () => {
    const expiry = describeSessionExpiry(inMinutes(-5), now);
    expect(expiry.kind).toBe('ended');
    expect(expiry.kind !== 'fine' && expiry.text).toContain('stays on this device');
  });
});
