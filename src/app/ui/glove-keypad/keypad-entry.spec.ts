import fc from 'fast-check';
import { formatTenths, parseTenths } from '../../../../shared/rules/measurement';
import {
  commitEntry,
  describeRange,
  emptyEntry,
  entryFromTenths,
  entryTenths,
  entryText,
  measureUnitOf,
  pressKey,
  rangeProblemWhileTyping,
  readTypedEntry,
  type KeypadEntry,
  type KeypadKey,
  type KeypadRange,
} from './keypad-entry';

/** Presses the keys in order from an empty entry; the last refusal (if any) comes back too. */
function press(keys: readonly KeypadKey[], allowNegative = true): { entry: KeypadEntry; refusal: string | null } {
  let result = { entry: emptyEntry, refusal: null as string | null };
  for (const key of keys) result = pressKey(result.entry, key, allowNegative);
  return result;
}

const keysOf = (text: string): KeypadKey[] => [...text].map((char) => (char === '-' ? '±' : (char as KeypadKey)));
const typed = (text: string, allowNegative = true) => {
  const reading = readTypedEntry(text, allowNegative);
  if (reading.problem !== null) throw new Error(`expected "${text}" to be read, got: ${reading.problem}`);
  return reading.entry;
};

const coldRange: KeypadRange = { minTenths: -200, maxTenths: 50 };
const tenAndUp: KeypadRange = { minTenths: 100, maxTenths: 500 };

describe('keypad entry: keys', () => {
  it('when digits, a point and a tenth are pressed, then the entry reads as tenths', () => {
    const { entry } = press(['1', '2', '.', '5']);
    expect(entryText(entry)).toBe('12.5');
    expect(entryTenths(entry, '°C')).toBe(125);
  });

  it('when ± is pressed, then the sign flips, before or after the digits', () => {
    expect(entryTenths(press(['±', '3', '.', '4']).entry, '°C')).toBe(-34);
    expect(entryTenths(press(['3', '.', '4', '±']).entry, '°C')).toBe(-34);
    expect(entryTenths(press(['3', '±', '±']).entry, '°C')).toBe(30);
    expect(entryText(press(['±']).entry)).toBe('−');
  });

  it('when negatives are not allowed, then ± is refused in words and the entry stays', () => {
    const { entry, refusal } = press(['3', '±'], false);
    expect(entryText(entry)).toBe('3');
    expect(refusal).toBe('Negative values are not used here.');
  });

  it('when the point is pressed twice, then the second is refused', () => {
    const { entry, refusal } = press(['4', '.', '.']);
    expect(entryText(entry)).toBe('4.');
    expect(refusal).toMatch(/One decimal point only/);
  });

  it('when a second digit follows the point, then it is refused: one decimal only', () => {
    const { entry, refusal } = press(['4', '.', '9', '5']);
    expect(entryText(entry)).toBe('4.9');
    expect(refusal).toMatch(/One decimal only/);
  });

  it('when the point comes first, then a 0 is put before it', () => {
    expect(entryText(press(['.', '5']).entry)).toBe('0.5');
  });

  it('when a digit follows a lone 0, then it takes the 0’s place', () => {
    expect(entryText(press(['0', '0', '7']).entry)).toBe('7');
  });

  it('when a sixth digit before the point is pressed, then it is refused', () => {
    const { entry, refusal } = press(['1', '2', '3', '4', '5', '6']);
    expect(entryText(entry)).toBe('12345');
    expect(refusal).toBe('At most 5 digits before the point.');
  });

  it('when backspace is pressed, then the last key goes: tenth, point, digits, then the sign', () => {
    const steps: string[] = [];
    let { entry } = press(['±', '1', '2', '.', '3']);
    while (entryText(entry) !== '') {
      entry = pressKey(entry, 'backspace', true).entry;
      steps.push(entryText(entry));
    }
    expect(steps).toEqual(['−12.', '−12', '−1', '−', '']);
  });

  it('when clear is pressed, then the whole entry goes', () => {
    expect(press(['±', '1', '.', '2', 'clear']).entry).toEqual(emptyEntry);
  });

  it('when nothing or only a sign is keyed, then there is no value yet', () => {
    expect(entryTenths(emptyEntry, 'kg')).toBeNull();
    expect(entryTenths(press(['±']).entry, 'kg')).toBeNull();
  });

  it('when "4." is left without its tenth, then it counts as 4.0', () => {
    expect(entryTenths(press(['4', '.']).entry, 'kg')).toBe(40);
  });

  it('when any reading is keyed as it is written out, then the keypad gives what the shared reader gives', () => {
    fc.assert(
      fc.property(fc.integer({ min: -99_999, max: 99_999 }), (tenths) => {
        const written = formatTenths(tenths, 'celsius').replace(' °C', '').replace('+', '').replace('−', '-');
        const keyed = press(keysOf(written)).entry;
        return entryTenths(keyed, 'celsius') === parseTenths(written, 'celsius') && entryTenths(keyed, 'celsius') === tenths;
      }),
    );
  });

  it('when an initial value is shown, then it comes back unchanged', () => {
    fc.assert(fc.property(fc.integer({ min: -999_999, max: 999_999 }), (tenths) => entryTenths(entryFromTenths(tenths), 'mm') === tenths));
    expect(entryText(entryFromTenths(-49))).toBe('−4.9');
    expect(entryFromTenths(null)).toEqual(emptyEntry);
  });
});

describe('keypad entry: typed text', () => {
  it('when a reading is typed with a hyphen, a true minus, a comma or a plus, then it is read as tenths', () => {
    expect(entryTenths(typed('-3.4'), '°C')).toBe(-34);
    expect(entryTenths(typed('−3,4'), '°C')).toBe(-34);
    expect(entryTenths(typed(' +12 '), '°C')).toBe(120);
    expect(entryTenths(typed('007,5'), 'kg')).toBe(75);
    expect(entryText(typed(',5'))).toBe('0.5');
  });

  it('when a partial reading is typed, then it is kept to be finished, not refused', () => {
    expect(entryText(typed('-'))).toBe('−');
    expect(entryText(typed('4.'))).toBe('4.');
    expect(typed('')).toEqual(emptyEntry);
  });

  it('when two decimal points are typed, then it says so in words', () => {
    expect(readTypedEntry('3.4.5', true).problem).toBe('One decimal point only: "3.4.5" has 2.');
    expect(readTypedEntry('3,4.5', true).problem).toBe('One decimal point only: "3,4.5" has 2.');
  });

  it('when more than one digit follows the point, then it says so in words', () => {
    expect(readTypedEntry('4.95', true).problem).toBe('One decimal only: "4.95" has 2 digits after the point.');
  });

  it('when letters, a misplaced sign or too many digits are typed, then each is refused in words', () => {
    expect(readTypedEntry('4a', true).problem).toBe('"4a" is not a number: use digits, one decimal point and a minus sign.');
    expect(readTypedEntry('4a', false).problem).toBe('"4a" is not a number: use digits, one decimal point.');
    expect(readTypedEntry('3-', true).problem).toBe('Put the minus sign first, and only once.');
    expect(readTypedEntry('--3', true).problem).toBe('Put the minus sign first, and only once.');
    expect(readTypedEntry('123456', true).problem).toBe('At most 5 digits before the point.');
  });

  it('when a negative is typed where negatives are not used, then it is refused', () => {
    expect(readTypedEntry('-2', false).problem).toBe('Negative values are not used here.');
  });
});

describe('keypad entry: range', () => {
  it('when the range is described, then it uses one decimal, the true minus and the unit', () => {
    expect(describeRange(coldRange, '°C')).toBe('From −20.0 °C to +5.0 °C');
    expect(describeRange({ minTenths: 0, maxTenths: null }, 'kg')).toBe('At least 0.0 kg');
    expect(describeRange({ minTenths: null, maxTenths: 2300 }, 'kilogram')).toBe('At most 230.0 kg');
    expect(describeRange({ minTenths: null, maxTenths: null }, 'mm')).toBeNull();
  });

  it('when the entry is already above the highest allowed, then it says too high while typing', () => {
    expect(rangeProblemWhileTyping(typed('12'), coldRange, '°C')).toBe('Too high: above the highest allowed, at most +5.0 °C here.');
    expect(rangeProblemWhileTyping(typed('5.1'), coldRange, '°C')).toMatch(/^Too high/);
    expect(rangeProblemWhileTyping(typed('6.'), coldRange, '°C')).toMatch(/^Too high/);
  });

  it('when a negative entry can only get lower than the lowest allowed, then it says too low while typing', () => {
    expect(rangeProblemWhileTyping(typed('-21'), coldRange, '°C')).toBe('Too low: below the lowest allowed, at least −20.0 °C here.');
    expect(rangeProblemWhileTyping(typed('-20.1'), coldRange, '°C')).toMatch(/^Too low/);
  });

  it('when a partial entry could still become valid, then it is not an error yet', () => {
    expect(rangeProblemWhileTyping(typed('-'), tenAndUp, 'kg')).toBeNull(); // no number yet
    expect(rangeProblemWhileTyping(typed('1'), tenAndUp, 'kg')).toBeNull(); // 1 → 10 to 19
    expect(rangeProblemWhileTyping(typed('5'), tenAndUp, 'kg')).toBeNull(); // 5.0 itself is too low, 50.0 is allowed
    expect(rangeProblemWhileTyping(typed('0'), tenAndUp, 'kg')).toBeNull();
    expect(rangeProblemWhileTyping(typed('-2'), coldRange, '°C')).toBeNull(); // −2 → −20
    expect(rangeProblemWhileTyping(emptyEntry, coldRange, '°C')).toBeNull();
  });

  it('when no further digit could bring it into range, then it is an error at once', () => {
    expect(rangeProblemWhileTyping(typed('1.'), tenAndUp, 'kg')).toMatch(/^Too low/); // 1.0 to 1.9 only
    expect(rangeProblemWhileTyping(typed('51'), tenAndUp, 'kg')).toMatch(/^Too high/); // 51.0 and up
    expect(rangeProblemWhileTyping(typed('-0'), { minTenths: 10, maxTenths: null }, 'kg')).toMatch(/^Too low/);
    // 6, 60 to 69 and 600 to 699 straddle 7.0 to 8.0: the value itself decides the side.
    expect(rangeProblemWhileTyping(typed('6'), { minTenths: 70, maxTenths: 80 }, 'kg')).toMatch(/^Too low/);
  });

  it('when OK is pressed on a value that could have grown into range, then it is refused as too low', () => {
    expect(commitEntry(typed('5'), tenAndUp, 'kg')).toEqual({ tenths: null, problem: 'Too low: below the lowest allowed, at least 10.0 kg here.' });
  });

  it('when OK is pressed on a value in range, then it gives the tenths, the limits included', () => {
    expect(commitEntry(typed('-3.4'), coldRange, '°C')).toEqual({ tenths: -34, problem: null });
    expect(commitEntry(typed('-20'), coldRange, '°C').tenths).toBe(-200);
    expect(commitEntry(typed('5'), coldRange, '°C').tenths).toBe(50);
    expect(commitEntry(typed('99999.9'), { minTenths: null, maxTenths: null }, 'mm').tenths).toBe(999_999);
  });

  it('when OK is pressed with nothing keyed, then it asks for a value', () => {
    expect(commitEntry(typed('-'), coldRange, '°C').problem).toBe('Key in a value first, then press OK.');
  });

  it('when the unit is given by name or by symbol, then both mean the same unit', () => {
    expect(measureUnitOf('°C')).toBe('celsius');
    expect(measureUnitOf('celsius')).toBe('celsius');
    expect(measureUnitOf('°')).toBe('degree');
    expect(measureUnitOf('mm')).toBe('millimetre');
  });

  it('when any entry is checked while typing, then it is flagged only if no further keys reach the range', () => {
    // Brute force: every continuation of up to 4 more keys reaches every value up to 100.0 from these starts.
    const reachable = (entry: KeypadEntry, depth: number): number[] => {
      const value = entryTenths(entry, 'kg');
      const here = value === null ? [] : [value];
      if (depth === 0) return here;
      const next = (['0', '1', '2', '3', '4', '5', '6', '7', '8', '9', '.'] as const)
        .map((key) => pressKey(entry, key, true))
        .filter((result) => result.refusal === null);
      return [...here, ...next.flatMap((result) => reachable(result.entry, depth - 1))];
    };
    const starts = ['0', '1', '-1', '2.', '-0.', '-0', '12', '9', '-95', '3.3'];
    const reachableFrom = new Map(starts.map((start) => [start, new Set(reachable(typed(start), 4))]));
    fc.assert(
      fc.property(fc.constantFrom(...starts), fc.integer({ min: -600, max: 600 }), fc.integer({ min: 0, max: 400 }), (start, min, width) => {
        const range = { minTenths: min, maxTenths: min + width };
        const canReach = [...reachableFrom.get(start)!].some((value) => value >= min && value <= min + width);
        return canReach === (rangeProblemWhileTyping(typed(start), range, 'kg') === null);
      }),
      { numRuns: 2000 },
    );
  });
});
