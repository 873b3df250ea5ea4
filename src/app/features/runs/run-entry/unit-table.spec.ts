import { displayFromSi, fromSi, toSi, unitLabel, unitsOf } from './unit-table';

describe('unit table (display only)', () => {
  // Factors from NIST SP 811 (2008) App. B.8 and B.9.
  it.each([
    ['pressure', 'kPa', 101.325, 101325],
    ['pressure', 'bar', 1.01325, 101325],
    ['pressure', 'psi', 1, 6894.757293168361],
    ['pressure', 'torr', 760, 101325],
    ['pressure', 'mmHg', 1, 133.322387415],
    ['volume', 'mL', 250, 2.5e-4],
    ['volume', 'L', 1.2, 1.2e-3],
    ['length', 'mm', 12.5, 0.0125],
    ['temperature', 'degC', 25, 298.15],
    ['temperature', 'degF', 32, 273.15],
    ['voltage', 'mV', 1500, 1.5],
    ['time', 'min', 2, 120],
  ] as const)('%s: %d %s is %d in SI', (kind, unit, value, si) => {
    expect(toSi(kind, unit, value)).toBeCloseTo(si, 10);
    expect(fromSi(kind, unit, si)).toBeCloseTo(value, 10);
  });

  it.each([
    ['pressure', 'kPa', '101.325'],
    ['pressure', 'psi', '14.7'],
    ['temperature', 'degC', '21.37'],
    ['temperature', 'degF', '-40'],
    ['volume', 'mL', '0.1'],
    ['current', 'mA', '2.345'],
  ] as const)('shows %s typed in %s as typed after the SI round trip (%s)', (kind, unit, typed) => {
    expect(displayFromSi(kind, unit, toSi(kind, unit, Number(typed)))).toBe(typed);
  });

  it('shows an empty cell for a missing reading', () => {
    expect(displayFromSi('pressure', 'kPa', null)).toBe('');
  });

  it('refuses a unit of the wrong kind instead of guessing', () => {
    expect(() => toSi('pressure', 'mL', 1)).toThrow('"mL" is not a pressure unit');
  });

  it('names units the way people write them', () => {
    expect(unitsOf('temperature').map(unitLabel)).toEqual(['K', '°C', '°F']);
    expect(unitLabel('m3')).toBe('m³');
  });
});
