import fc from 'fast-check';
import {
  AVOGADRO, BOLTZMANN, ENERGY_FACTORS, PRESSURE_FACTORS, R_GAS, VOLUME_FACTORS, differenceToSi, fromSi, gaugeToAbsolute,
  isIsoDate, isoToSeconds, pistonArea, toSi, unitsOf, type UnitKind,
} from './units';

const rel = (a: number, b: number) => Math.abs(a - b) / Math.abs(b);

describe('exact constants (2019 SI)', () => {
  it('R = N_A·k_B = 8.314 462 618 153 24 J/(mol·K)', () => {
    // CODATA 2018 / SI Brochure 9th ed. Table 1: k_B and N_A exact; R is their exact product
    expect(BOLTZMANN).toBe(1.380649e-23);
    expect(AVOGADRO).toBe(6.02214076e23);
    expect(R_GAS).toBe(8.31446261815324);
    expect(rel(AVOGADRO * BOLTZMANN, R_GAS)).toBeLessThan(1e-15);
  });
});

describe('pressure factors (NIST SP 811 (2008) App. B.8)', () => {
  it.each([
    ['Pa', 1],
    ['kPa', 1e3],
    ['MPa', 1e6],
    ['bar', 1e5], // SP 811 B.8: bar = 1e5 Pa exactly
    ['mbar', 1e2],
    ['atm', 101325], // 10th CGPM (1954); SP 811 B.8
    ['torr', 101325 / 760], // SP 811 B.8: torr = atm/760 = 133.322 368 421… Pa
    ['mmHg', 133.322387415], // SP 811 B.8 conventional mmHg = 13.5951 g/cm³ × g_n × 1 mm
    ['psi', 8896443230521 / 1290320000], // SP 811 B.8: lbf/in² as an exact rational, 6894.757 293 168 361… Pa
  ] as const)('%s', (unit, pa) => {
    expect(rel(PRESSURE_FACTORS[unit], pa)).toBeLessThan(1e-14);
  });
  it('psi agrees with the 1959 pound and inch: 0.453 592 37 kg × 9.806 65 m/s² / (0.0254 m)²', () => {
    // 1959 international yard-and-pound agreement; 3rd CGPM (1901) standard gravity
    expect(rel(PRESSURE_FACTORS.psi, 6894.757293168361)).toBeLessThan(1e-15);
  });
  it('torr and mmHg differ at the 1.4e-7 level', () => {
    // SP 811 B.8: 1 Torr = 0.999 999 857 5 mmHg
    expect(PRESSURE_FACTORS.torr).not.toBe(PRESSURE_FACTORS.mmHg);
    expect(PRESSURE_FACTORS.torr / PRESSURE_FACTORS.mmHg).toBeCloseTo(0.9999998575, 10);
  });
});

describe('other factors', () => {
  it('volume: L = 1e-3 m³ (12th CGPM 1964 Res. 6), mL = cm³ = 1e-6 m³', () => {
    expect(rel(VOLUME_FACTORS.L, 1e-3)).toBeLessThan(1e-15);
    expect(rel(VOLUME_FACTORS.mL, 1e-6)).toBeLessThan(1e-15);
    expect(VOLUME_FACTORS.cm3).toBe(VOLUME_FACTORS.mL);
    expect(VOLUME_FACTORS.m3).toBe(1);
  });
  it('energy: cal_th = 4.184 J exactly, kJ, Wh = 3600 J (SP 811 B.8)', () => {
    expect(ENERGY_FACTORS.cal_th).toBe(4.184);
    expect(ENERGY_FACTORS.kJ).toBe(1000);
    expect(ENERGY_FACTORS.Wh).toBe(3600);
    expect(ENERGY_FACTORS.J).toBe(1);
  });
  it('heat capacity, electrical, time and mass factors (SI prefixes, SP 811)', () => {
    expect(toSi('heatCapacity', 'kJ/K', 4.5)).toBe(4500);
    expect(toSi('heatCapacity', 'cal_th/K', 1)).toBe(4.184);
    expect(toSi('voltage', 'mV', 1500)).toBeCloseTo(1.5, 15);
    expect(toSi('current', 'mA', 250)).toBeCloseTo(0.25, 15);
    expect(toSi('power', 'mW', 250)).toBeCloseTo(0.25, 15);
    expect(toSi('power', 'W', 3)).toBe(3);
    expect(toSi('voltage', 'V', 3)).toBe(3);
    expect(toSi('current', 'A', 3)).toBe(3);
    expect(toSi('time', 'min', 2)).toBe(120);
    expect(toSi('time', 'h', 1.5)).toBe(5400);
    expect(toSi('time', 's', 7)).toBe(7);
    expect(toSi('mass', 'g', 1.5)).toBeCloseTo(1.5e-3, 18);
    expect(toSi('mass', 'mg', 2)).toBeCloseTo(2e-6, 20);
    expect(toSi('length', 'mm', 80)).toBeCloseTo(0.08, 15);
  });
  it('temperature: T/K = t/°C + 273.15 and (t/°F + 459.67)·5/9 (SP 811 B.9)', () => {
    expect(toSi('temperature', 'degC', 26.85)).toBeCloseTo(300, 12);
    expect(toSi('temperature', 'degF', 32)).toBeCloseTo(273.15, 12);
    expect(toSi('temperature', 'degF', 212)).toBeCloseTo(373.15, 12);
    expect(toSi('temperature', 'degF', -459.67)).toBeCloseTo(0, 12);
    // A temperature difference of 1 °F is 5/9 K; offsets cancel (SP 811 B.9 note)
    expect(differenceToSi('temperature', 'degF', 9)).toBeCloseTo(5, 14);
    expect(differenceToSi('temperature', 'degC', 2)).toBe(2);
  });
  it('gauge pressure becomes absolute with a barometric reading and is refused without one', () => {
    // common practice: P_abs = P_gauge + P_barometric
    expect(gaugeToAbsolute(150e3, 101325)).toBe(251325);
    expect(() => gaugeToAbsolute(150e3, undefined)).toThrow(/barometric/);
  });
  it('piston area is π·d²/4 (geometry)', () => {
    expect(pistonArea(0.08)).toBeCloseTo(5.026548245743669e-3, 17);
  });
  it('ISO timestamps become seconds after the first reading', () => {
    expect(isoToSeconds(['2026-03-14T09:30:00Z', '2026-03-14T09:31:30.5Z', '2026-03-14T10:30:00+01:00'])).toEqual([0, 90.5, 0]);
    expect(isIsoDate('2026-03-14')).toBe(true);
    expect(isIsoDate('14/03/2026')).toBe(false);
  });
});

describe('round trips (property)', () => {
  const kinds: UnitKind[] = ['pressure', 'volume', 'length', 'temperature', 'energy', 'heatCapacity', 'voltage', 'current', 'power', 'time', 'mass'];
  it('fromSi(toSi(x)) = x for every unit', () => {
    const pairs = kinds.flatMap((k) => unitsOf(k).map((u) => [k, u] as const));
    fc.assert(
      fc.property(fc.constantFrom(...pairs), fc.double({ min: -1e6, max: 1e6, noNaN: true }), ([kind, unit], x) => {
        const back = fromSi(kind, unit, toSi(kind, unit, x));
        expect(Math.abs(back - x)).toBeLessThanOrEqual(1e-12 * Math.max(1, Math.abs(x)) * 1e3);
      }),
    );
  });
});
