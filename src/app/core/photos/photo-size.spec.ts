import { fitWithin } from './photo-size';

describe('fitWithin', () => {
  it('when a phone photo is larger than 1600 px, then its long edge becomes 1600 and its shape stays', () => {
    expect(fitWithin(4032, 3024)).toEqual({ width: 1600, height: 1200 });
    expect(fitWithin(3024, 4032)).toEqual({ width: 1200, height: 1600 });
  });

  it('when a picture is already small, then it is never enlarged', () => {
    expect(fitWithin(800, 600)).toEqual({ width: 800, height: 600 });
    expect(fitWithin(1600, 10)).toEqual({ width: 1600, height: 10 });
  });

  it('when a picture is a thin strip, then no side rounds down to nothing', () => {
    expect(fitWithin(20_000, 3)).toEqual({ width: 1600, height: 1 });
  });

  it('when a size is not above zero, then it is refused', () => {
    expect(() => fitWithin(0, 600)).toThrow(RangeError);
    expect(() => fitWithin(Number.NaN, 600)).toThrow(RangeError);
  });
});
