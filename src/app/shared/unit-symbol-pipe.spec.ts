import { UnitSymbolPipe } from './unit-symbol-pipe';

describe('UnitSymbolPipe', () => {
  const pipe = new UnitSymbolPipe();

  // SI brochure (BIPM, 9th ed.) symbols: °C for degree Celsius, m³ for cubic metre; a code that is
  // already its own symbol passes through.
  it('writes unit codes as their symbols', () => {
    expect(['degC', 'degF', 'm3', 'cm3', 'kPa', 'K'].map((u) => pipe.transform(u))).toEqual(['°C', '°F', 'm³', 'cm³', 'kPa', 'K']);
  });

  it('writes nothing for a missing unit', () => {
    expect(pipe.transform(null)).toBe('');
    expect(pipe.transform(undefined)).toBe('');
  });
});
