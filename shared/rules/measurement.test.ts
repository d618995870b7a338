import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { expectRulesError } from './expect-rules-error';
import { formatTenths, measurementSchema, parseTenths } from './measurement';

describe('readings in tenths', () => {
  it('when a reading is written out, then it uses one decimal, the true minus sign and a plus for warm temperatures', () => {
    expect(formatTenths(-49, 'celsius')).toBe('−4.9 °C');
    expect(formatTenths(11, 'celsius')).toBe('+1.1 °C');
    expect(formatTenths(0, 'celsius')).toBe('0.0 °C');
    expect(formatTenths(230, 'kilogram')).toBe('23.0 kg');
  });

  it('when an official keys a reading with a minus, a comma or a plus, then it is read as tenths', () => {
    expect(parseTenths('-4.9', 'celsius')).toBe(-49);
    expect(parseTenths('−4,9', 'celsius')).toBe(-49);
    expect(parseTenths('+12', 'celsius')).toBe(120);
    expect(parseTenths('-0.0', 'celsius')).toBe(0);
  });

  it('when any whole number of tenths is written out and keyed back, then the same number comes back', () => {
    fc.assert(fc.property(fc.integer({ min: -99_999, max: 99_999 }), (tenths) => parseTenths(formatTenths(tenths, 'celsius').replace(' °C', ''), 'celsius') === tenths));
  });

  it('when a value between two tenths is keyed or stored, then it is refused', () => {
    // trade practice, no published source: temperatures to 0.1 °C, weights to 0.1 kg
    fc.assert(
      fc.property(fc.integer({ min: -9999, max: 9999 }), fc.integer({ min: 1, max: 9 }), (tenths, hundredth) => {
        const text = `${(tenths / 10).toFixed(1)}${hundredth}`;
        expect(() => parseTenths(text, 'kilogram')).toThrow(/at most one decimal/);
        return !measurementSchema.safeParse({ tenths: tenths + hundredth / 10, unit: 'kilogram' }).success;
      }),
    );
    expectRulesError(() => parseTenths('4.95', 'celsius'), 'invalid-input');
    expectRulesError(() => parseTenths('', 'celsius'), 'invalid-input');
  });
});
