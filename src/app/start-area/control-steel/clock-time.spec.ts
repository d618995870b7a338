import { dayWords } from './clock-time';

describe('dayWords', () => {
  it('when a time is on the day of now, the day after or before, then it says so; further away, it names the day', () => {
    const now = new Date(2027, 0, 14, 9, 20).getTime();
    expect(dayWords(new Date(2027, 0, 14, 23, 59).getTime(), now)).toBe('today');
    expect(dayWords(new Date(2027, 0, 15, 0, 0).getTime(), now)).toBe('tomorrow');
    expect(dayWords(new Date(2027, 0, 13, 22, 0).getTime(), now)).toBe('yesterday');
    expect(dayWords(new Date(2027, 0, 16, 10, 0).getTime(), now)).toBe('Sat 16 Jan');
  });
});
