import { WithUncertaintyPipe, formatWithUncertainty, roundToUncertainty } from './value-with-uncertainty-pipe';

// Rounding rule checked here: GUM (JCGM 100:2008) 7.2.6 — U to at most two significant digits,
// the estimate rounded to the same decimal place as U.
describe('value ± U formatting', () => {
  it('rounds U = 0.0234 to 0.023 and x to the same decimal place', () => {
    expect(roundToUncertainty(1.23456, 0.0234)).toEqual({ value: '1.235', uncertainty: '0.023' });
    expect(formatWithUncertainty(1.23456, 0.0234, 'J')).toBe('1.235 ± 0.023 J (k = 2)');
  });

  it('keeps trailing zeros that carry the decimal place', () => {
    expect(formatWithUncertainty(-60.496888, 0.30347, 'J')).toBe('\u221260.50 ± 0.30 J (k = 2)');
    expect(formatWithUncertainty(12, 0.5)).toBe('12.00 ± 0.50 (k = 2)');
  });

  it('moves up one place when U rounds to three digits (0.0996 → 0.10)', () => {
    expect(roundToUncertainty(3.14159, 0.0996)).toEqual({ value: '3.14', uncertainty: '0.10' });
  });

  it('rounds negative values away from zero like positive ones and never prints −0', () => {
    expect(roundToUncertainty(-36.00798, 27.65055)).toEqual({ value: '\u221236', uncertainty: '28' });
    expect(roundToUncertainty(-0.0059980, 0.398064)).toEqual({ value: '\u22120.01', uncertainty: '0.40' });
    expect(roundToUncertainty(-0.004, 0.398064)).toEqual({ value: '0.00', uncertainty: '0.40' });
  });

  it('rounds large values to tens and groups five or more digits, with the unit after U', () => {
    expect(formatWithUncertainty(101_325.4, 1_234, 'Pa')).toBe('101\u202f300 ± 1200 Pa (k = 2)');
    expect(formatWithUncertainty(4_520.7, 37.4, 'J', 2)).toBe('4521 ± 37 J (k = 2)');
  });

  it('shows an exact zero uncertainty as 0 and x to six significant digits', () => {
    expect(formatWithUncertainty(0, 0, 'J')).toBe('0 ± 0 J (k = 2)');
    expect(roundToUncertainty(2.718281828, 0)).toEqual({ value: '2.71828', uncertainty: '0' });
  });

  it('names the coverage factor it is given', () => {
    expect(formatWithUncertainty(10.04, 0.12, 'K', 3)).toBe('10.04 ± 0.12 K (k = 3)');
  });

  it('prints a standard uncertainty without a coverage factor when k is null, still to two significant digits', () => {
    // The fitted heat-loss coefficient that printed as "0.121 ± 0.000 W/K" with a fixed three decimals
    expect(formatWithUncertainty(0.1210843, 0.000231, 'W/K', null)).toBe('0.12108 ± 0.00023 W/K');
    expect(formatWithUncertainty(4851.73, 4.62, 'J/K', null)).toBe('4851.7 ± 4.6 J/K');
    expect(new WithUncertaintyPipe().transform(4851.73, 4.62, 'J/K', null)).toBe('4851.7 ± 4.6 J/K');
  });

  it('shows a dash for a missing value in the pipe', () => {
    const pipe = new WithUncertaintyPipe();
    expect(pipe.transform(null, 0.1, 'J')).toBe('—');
    expect(pipe.transform(1.5, 0.25, 'J')).toBe('1.50 ± 0.25 J (k = 2)');
  });
});
