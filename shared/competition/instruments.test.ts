import { describe, expect, it } from 'vitest';
import { RulesInputError } from '../rules/rules-error';
import { instrumentPurposeLabel, instrumentPurposes, instrumentRefusal, instrumentSchema, type Instrument } from './instruments';

const pim = 'official-pim';
const kaja = 'official-kaja';
const instrument = (overrides: Partial<Instrument> = {}): Instrument => ({
  id: '0193a5c0-0001-7000-8000-000000000101',
  label: 'PYR-01',
  purpose: 'sled-pyrometer',
  calibratedUntil: '2027-07-08',
  assignedTo: pim,
  nominalMass: null,
  certificateSha256: null,
  ...overrides,
});
const raceDay = '2027-01-09';

describe('instrumentRefusal', () => {
  it('when the official uses their own calibrated instrument for its purpose, then nothing is refused', () => {
    expect(instrumentRefusal(instrument(), { userId: pim, purpose: 'sled-pyrometer', on: raceDay })).toBeNull();
  });

  it('when a sled pyrometer is offered for the control steel, then it is refused, saying which pyrometer the control steel needs', () => {
    // trade practice, no published source: a second pyrometer is kept only for the control steel and
    // labelled so it cannot be confused with the sled pyrometer
    const refusal = instrumentRefusal(instrument({ label: 'PYR-03' }), { userId: pim, purpose: 'control-steel-pyrometer', on: raceDay });
    expect(refusal).toBe('PYR-03 is a sled pyrometer; the control steel is read with a control steel pyrometer.');
  });

  it('when the control steel pyrometer is offered for a sled, then it is refused too', () => {
    // trade practice, no published source: the control steel pyrometer is kept for the control steel only
    const refusal = instrumentRefusal(instrument({ purpose: 'control-steel-pyrometer' }), { userId: pim, purpose: 'sled-pyrometer', on: raceDay });
    expect(refusal).toBe("PYR-01 is a control steel pyrometer; a sled's steels are read with a sled pyrometer.");
  });

  it('when an angle gauge is offered where a caliper is needed, then the article and the job read right', () => {
    const refusal = instrumentRefusal(instrument({ label: 'ANG-01', purpose: 'angle-gauge' }), { userId: pim, purpose: 'caliper', on: raceDay });
    expect(refusal).toBe('ANG-01 is an angle gauge; widths and thicknesses are measured with a caliper.');
  });

  it('when the calibration ran out the day before, then it is refused, naming the last calibrated day', () => {
    // trade practice, no published source: only calibrated instruments are used
    const refusal = instrumentRefusal(instrument({ label: 'PYR-05', calibratedUntil: '2027-01-05' }), { userId: pim, purpose: 'sled-pyrometer', on: '2027-01-06' });
    expect(refusal).toBe('PYR-05 was calibrated until 2027-01-05; use a calibrated instrument.');
  });

  it('when it is the last calibrated day, then the instrument may still be used', () => {
    expect(instrumentRefusal(instrument({ calibratedUntil: '2027-01-09' }), { userId: pim, purpose: 'sled-pyrometer', on: '2027-01-09' })).toBeNull();
  });

  it('when the calibration ran out at the turn of a year, then the days still compare as days', () => {
    const refusal = instrumentRefusal(instrument({ calibratedUntil: '2026-12-31' }), { userId: pim, purpose: 'sled-pyrometer', on: '2027-01-01' });
    expect(refusal).toContain('was calibrated until 2026-12-31');
  });

  it('when the instrument is issued to another official, then it is refused', () => {
    // trade practice, no published source: pyrometers and gauges are handed to the officials who alone may use them
    const refusal = instrumentRefusal(instrument({ label: 'PYR-02', assignedTo: kaja }), { userId: pim, purpose: 'sled-pyrometer', on: raceDay });
    expect(refusal).toBe('PYR-02 is assigned to another official.');
  });

  it('when the instrument is issued to nobody yet, then it is refused, saying who assigns it', () => {
    const refusal = instrumentRefusal(instrument({ assignedTo: null }), { userId: pim, purpose: 'sled-pyrometer', on: raceDay });
    expect(refusal).toBe('PYR-01 is not issued to any official yet; ask the area leader to assign it to you.');
  });

  it('when several things are wrong, then the kind of instrument is named first, then its calibration', () => {
    const wrongEverything = instrument({ calibratedUntil: '2026-01-01', assignedTo: kaja });
    expect(instrumentRefusal(wrongEverything, { userId: pim, purpose: 'scale', on: raceDay })).toBe('PYR-01 is a sled pyrometer; weighing is done on a scale.');
    expect(instrumentRefusal(wrongEverything, { userId: pim, purpose: 'sled-pyrometer', on: raceDay })).toContain('was calibrated until 2026-01-01');
  });

  it('when the day is not a plain date, then it throws rather than compare a timestamp with a date', () => {
    expect(() => instrumentRefusal(instrument(), { userId: pim, purpose: 'sled-pyrometer', on: '2027-01-09T23:00:00Z' })).toThrow(RulesInputError);
  });
});

describe('instrument purposes and shape', () => {
  it('when every purpose is labelled, then each reads as a capitalised name without its article', () => {
    expect(instrumentPurposes.map(instrumentPurposeLabel)).toEqual([
      'Control steel pyrometer',
      'Sled pyrometer',
      'Scale',
      'Control weight',
      'Gap probe',
      'Caliper',
      'Steel rule',
      'Angle gauge',
    ]);
  });

  it.each([
    ['purpose', 'thermometer'],
    ['calibratedUntil', '05.01.2027'],
    ['label', '  '],
    ['certificateSha256', 'ABC'],
    ['id', 'pyr-01'],
  ])('when %s is %j, then the instrument is refused', (field, value) => {
    expect(instrumentSchema.safeParse({ ...instrument(), [field]: value }).success).toBe(false);
  });

  it('when the certificate is named by a SHA-256, then it parses', () => {
    const sha = 'ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad'; // FIPS 180-4 example: SHA-256 of "abc"
    expect(instrumentSchema.parse(instrument({ certificateSha256: sha })).certificateSha256).toBe(sha);
  });
});
