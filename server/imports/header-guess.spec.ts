import { guessColumn, splitHeader } from './header-guess';

describe('guessColumn', () => {
  it.each([
    ['P (kPa)', 'pressure', 'kPa', undefined],
    ['Pressure [bar]', 'pressure', 'bar', undefined],
    ['p_gauge (psi)', 'pressure', 'psi', 'gauge'],
    ['P_abs / mbar', 'pressure', 'mbar', 'absolute'],
    ['Pressure (psig)', 'pressure', 'psi', 'gauge'],
    ['T/°C', 'temperature', 'degC', undefined],
    ['Temp (degF)', 'temperature', 'degF', undefined],
    ['Temperature [K]', 'temperature', 'K', undefined],
    ['Heater current (mA)', 'current', 'mA', undefined],
    ['I [A]', 'current', 'A', undefined],
    ['U/V', 'voltage', 'V', undefined],
    ['Heater voltage (mV)', 'voltage', 'mV', undefined],
    ['Heater power (W)', 'power', 'W', undefined],
    ['Volume (mL)', 'volume', 'mL', undefined],
    ['V [L]', 'volume', 'L', undefined],
    ['Piston position [mm]', 'displacement', 'mm', undefined],
    ['Time (s)', 'time', 's', undefined],
    ['t/min', 'time', 'min', undefined],
    ['Elapsed (h)', 'time', 'h', undefined],
    ['Timestamp', 'time', 'iso', undefined],
  ])('reads %s as %s in %s', (header, channel, unit, reference) => {
    const { guess, confidence } = guessColumn(header);
    expect(guess).toEqual({ channel, unit, ...(reference ? { reference } : {}) });
    expect(confidence).toBeGreaterThanOrEqual(0.8);
  });

  it('names a channel without a unit with low confidence, and nothing for a header it does not know', () => {
    expect(guessColumn('Pressure')).toEqual({ guess: { channel: 'pressure', unit: null }, confidence: 0.5 });
    expect(guessColumn('Operator notes')).toEqual({ guess: { channel: null, unit: null }, confidence: 0 });
  });

  it('lets the unit decide when name and unit disagree ("P (W)" is a power), with less confidence', () => {
    const { guess, confidence } = guessColumn('P (W)');
    expect(guess.channel).toBe('power');
    expect(confidence).toBeLessThan(0.8);
  });

  it('splits the usual ways of writing a unit beside a name', () => {
    expect(splitHeader('Pressure [bar]')).toEqual({ name: 'Pressure', unit: 'bar' });
    expect(splitHeader('T/°C')).toEqual({ name: 'T', unit: '°C' });
    expect(splitHeader('Temperature in degC')).toEqual({ name: 'Temperature', unit: 'degC' });
    expect(splitHeader('Heater current')).toEqual({ name: 'Heater current', unit: null });
  });
});
