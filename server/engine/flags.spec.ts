import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { checkRunDocument, type BalanceResult } from './balance';
import type { FlagCode } from './flags';

// Each flag: one altered demo run that raises it, and the unaltered run that does not.
const load = (name: string) => JSON.parse(readFileSync(join(__dirname, '..', '..', 'fixtures', 'runs', name), 'utf8'));
const evaluate = (doc: unknown): BalanceResult => {
  const res = checkRunDocument(doc, { draws: 0 });
  if (!res.ok) throw new Error(JSON.stringify(res.errors));
  return res.result;
};
const codes = (doc: unknown) => evaluate(doc).flags.map((f) => f.code);
const flagsOf = (doc: unknown, code: FlagCode) => evaluate(doc).flags.filter((f) => f.code === code);

describe('TIME_NOT_INCREASING', () => {
  it('raises at the reading that goes back in time', () => {
    const doc = load('isothermal.json');
    doc.readings.time.values[40] = 38.5; // reading 41 now precedes reading 40 (t = 39 s)
    const f = flagsOf(doc, 'TIME_NOT_INCREASING');
    expect(f.map((x) => x.reading)).toEqual([41]);
    expect(f[0].message).toMatch(/Reading 41 is at 38.5 s, not after reading 40/);
  });
  it('does not raise on readings in time order', () => {
    expect(codes(load('isothermal.json'))).not.toContain('TIME_NOT_INCREASING');
  });
});

describe('TIME_GAP (a step longer than 5× the median step)', () => {
  it('raises for a 10 s jump in a 1 s series', () => {
    const doc = load('isothermal.json');
    doc.readings.time.values = doc.readings.time.values.map((t: number, i: number) => (i >= 100 ? t + 9 : t));
    expect(flagsOf(doc, 'TIME_GAP').map((f) => f.reading)).toEqual([101]);
  });
  it('does not raise for a 4 s jump (under 5× the median)', () => {
    const doc = load('isothermal.json');
    doc.readings.time.values = doc.readings.time.values.map((t: number, i: number) => (i >= 100 ? t + 3 : t));
    expect(codes(doc)).not.toContain('TIME_GAP');
  });
});

describe('NEGATIVE_ABSOLUTE_PRESSURE', () => {
  it('raises for a negative absolute reading', () => {
    const doc = load('isothermal.json');
    doc.readings.pressure.values[7] = -3;
    doc.instruments[0].range.min = -10;
    expect(flagsOf(doc, 'NEGATIVE_ABSOLUTE_PRESSURE').map((f) => f.reading)).toEqual([8]);
  });
  it('does not raise for a negative gauge reading that is positive absolute', () => {
    const doc = load('isobaric.json');
    doc.readings.pressure.values[7] = -0.2; // bar gauge, + 1.0142 bar barometric
    expect(codes(doc)).not.toContain('NEGATIVE_ABSOLUTE_PRESSURE');
  });
});

describe('NONPOSITIVE_TEMPERATURE', () => {
  it('raises for a reading at or below 0 K', () => {
    const doc = load('adiabatic.json');
    doc.readings.temperature.values[50] = -5;
    doc.instruments[2].range.min = -10;
    expect(flagsOf(doc, 'NONPOSITIVE_TEMPERATURE').map((f) => f.reading)).toEqual([51]);
  });
  it('does not raise for −5 °C (268.15 K)', () => {
    const doc = load('isothermal.json');
    doc.readings.temperature.values[50] = -5;
    expect(codes(doc)).not.toContain('NONPOSITIVE_TEMPERATURE');
  });
});

describe('OUT_OF_RANGE', () => {
  it('raises for each reading beyond the instrument range, naming the instrument', () => {
    const doc = load('isochoric.json');
    doc.instruments[0].range.max = 15.5; // psi; the heated vessel passes it near the end
    const f = flagsOf(doc, 'OUT_OF_RANGE');
    expect(f.length).toBeGreaterThan(0);
    expect(f[0].message).toMatch(/of PG-2 is .* psi, outside its range 0 to 15.5 psi/);
    expect(doc.readings.pressure.values[f[0].reading! - 1]).toBeGreaterThan(15.5);
    expect(doc.readings.pressure.values[f[0].reading! - 2]).toBeLessThanOrEqual(15.5);
  });
  it('writes a thermometer reading out of range in °C, not the stored code', () => {
    const doc = load('isothermal.json');
    const thermometer = doc.instruments.find((i: { id: string }) => i.id === doc.readings.temperature.instrument);
    expect(doc.readings.temperature.unit).toBe('degC');
    thermometer.range.max = doc.readings.temperature.values[0] - 1;
    const f = flagsOf(doc, 'OUT_OF_RANGE');
    // The SI brochure's symbol for the degree Celsius (common practice in every lab text).
    expect(f[0].message).toMatch(new RegExp(`of ${thermometer.id} is [-\\d.]+ °C, outside its range [-\\d.]+ to [-\\d.]+ °C`));
    expect(f[0].message).not.toContain('degC');
  });
  it('does not raise inside the range', () => {
    expect(codes(load('isochoric.json'))).not.toContain('OUT_OF_RANGE');
  });
});

describe('OUT_OF_CALIBRATION', () => {
  it('raises when the run date is after the due date', () => {
    const doc = load('calorimetric.json');
    doc.instruments[0].dueDate = '2026-03-01';
    const f = flagsOf(doc, 'OUT_OF_CALIBRATION');
    expect(f).toHaveLength(1);
    expect(f[0].reading).toBeNull();
    expect(f[0].message).toMatch(/TC-9 was due for calibration on 2026-03-01, before the run date 2026-03-14/);
  });
  it('does not raise on the due date itself', () => {
    const doc = load('calorimetric.json');
    doc.instruments[0].dueDate = '2026-03-14';
    expect(codes(doc)).not.toContain('OUT_OF_CALIBRATION');
  });
});

describe('ABOVE_RATED_PRESSURE', () => {
  it('raises above the apparatus rating', () => {
    const doc = load('isochoric.json');
    doc.apparatus.ratedPressure = { value: 15.5, unit: 'psi' };
    expect(flagsOf(doc, 'ABOVE_RATED_PRESSURE').length).toBeGreaterThan(0);
  });
  it('does not raise within the rating', () => {
    expect(codes(load('isochoric.json'))).not.toContain('ABOVE_RATED_PRESSURE');
  });
  it('says the reading and the rating in kPa and names the reference, without the SI figures', () => {
    const doc = load('isochoric.json');
    doc.apparatus.ratedPressure = { value: 100, unit: 'kPa' };
    const f = flagsOf(doc, 'ABOVE_RATED_PRESSURE');
    expect(f.length).toBeGreaterThan(0);
    const first = doc.readings.pressure.values[f[0].reading! - 1] * 6894.757293168361; // psi → Pa (NIST SP 811 B.8)
    expect(f[0].message).toMatch(/^Reading \d+ reaches [\d.]+ kPa absolute, above the vessel's rated 100 kPa absolute;/);
    expect(f[0].message).not.toMatch(/\d Pa\b/);
    expect(f[0].message).toContain(`reaches ${Number((first / 1000).toPrecision(4))} kPa absolute`);
  });
  it('reads a gauge rating above the run\'s barometric pressure (P_abs = P_gauge + P_baro, common practice)', () => {
    // The vessel peaks near 15.93 psi absolute ≈ 109.8 kPa; the barometer reads 760.2 mmHg ≈ 101.35 kPa.
    const doc = load('isochoric.json');
    doc.apparatus.ratedPressure = { value: 10, unit: 'kPa' };
    expect(flagsOf(doc, 'ABOVE_RATED_PRESSURE').length).toBeGreaterThan(0); // 10 kPa absolute: every reading is above
    doc.apparatus.ratedPressure = { value: 10, unit: 'kPa', reference: 'gauge' };
    expect(codes(doc)).not.toContain('ABOVE_RATED_PRESSURE'); // 10 kPa gauge ≈ 111.35 kPa absolute: none is
    doc.apparatus.ratedPressure = { value: 5, unit: 'kPa', reference: 'gauge' };
    const f = flagsOf(doc, 'ABOVE_RATED_PRESSURE');
    expect(f.length).toBeGreaterThan(0);
    expect(f[0].message).toMatch(/kPa gauge, above the vessel's rated 5 kPa gauge;/);
    doc.apparatus.ratedPressure = { value: 0.7, unit: 'psi', reference: 'gauge' };
    expect(flagsOf(doc, 'ABOVE_RATED_PRESSURE')[0].message).toMatch(/kPa gauge, above the vessel's rated 4.826 kPa gauge \(0.7 psi\);/); // 0.7 × 6.894757 kPa
  });
  it('refuses a gauge rating on a run with no barometric pressure, and an unknown reference', () => {
    const doc = load('isochoric.json');
    doc.apparatus.ratedPressure = { value: 5, unit: 'kPa', reference: 'gauge' };
    delete doc.ambient.pressure;
    const res = checkRunDocument(doc, { draws: 0 });
    expect(res.ok ? [] : res.errors.map((e) => e.path)).toContain('ambient.pressure');
    doc.apparatus.ratedPressure = { value: 5, unit: 'kPa', reference: 'sealed' };
    const bad = checkRunDocument(doc, { draws: 0 });
    expect(bad.ok ? [] : bad.errors.map((e) => e.path)).toContain('apparatus.ratedPressure.reference');
  });
});

describe('ISOTHERMAL_DRIFT (span of block means above 1 % of the mean temperature plus 3 u of the span)', () => {
  it('raises when an isothermal run warms by 6 K, near its end', () => {
    const doc = load('isothermal.json');
    doc.readings.temperature.values = doc.readings.temperature.values.map((t: number, i: number) => t + (6 * i) / 200);
    const f = flagsOf(doc, 'ISOTHERMAL_DRIFT');
    expect(f).toHaveLength(1);
    expect(f[0].reading).toBeGreaterThanOrEqual(191); // the last block of 10 readings starts at reading 191
  });
  it('does not raise for a 1 K drift', () => {
    const doc = load('isothermal.json');
    doc.readings.temperature.values = doc.readings.temperature.values.map((t: number, i: number) => t + i / 200);
    expect(codes(doc)).not.toContain('ISOTHERMAL_DRIFT');
  });
});

describe('ISOCHORIC_VOLUME_CHANGE (span above 0.5 % of the mean volume)', () => {
  const withVolume = (end: number) => {
    const doc = load('isochoric.json');
    const N = doc.readings.time.values.length;
    doc.readings.volume = { unit: 'L', values: Array.from({ length: N }, (_, i) => 1.5 + ((end - 1.5) * i) / (N - 1)) };
    return doc;
  };
  it('raises when the logged volume grows from 1.5 L to 1.6 L, near its end', () => {
    const f = flagsOf(withVolume(1.6), 'ISOCHORIC_VOLUME_CHANGE');
    expect(f).toHaveLength(1);
    expect(f[0].reading).toBeGreaterThanOrEqual(115); // the last block of 6 readings starts at reading 115
  });
  it('does not raise for 1.5 L to 1.503 L', () => {
    expect(codes(withVolume(1.503))).not.toContain('ISOCHORIC_VOLUME_CHANGE');
  });
});

describe('ADIABATIC_HEATER_POWER', () => {
  const withPower = (watts: number) => {
    const doc = load('adiabatic.json');
    doc.readings.power = { unit: 'W', values: doc.readings.time.values.map(() => watts) };
    return doc;
  };
  it('raises when a heater delivers 1 W during an adiabatic claim', () => {
    const f = flagsOf(withPower(1), 'ADIABATIC_HEATER_POWER');
    expect(f).toHaveLength(1);
    expect(f[0].message).toMatch(/claimed adiabatic but the heater delivered 6 J/);
  });
  it('does not raise for a heater channel that reads zero', () => {
    expect(codes(withPower(0))).not.toContain('ADIABATIC_HEATER_POWER');
  });
});

describe('INDEX_FAR_FROM_CLAIM', () => {
  it('raises when a n = 1.2 path is claimed adiabatic (γ of CO2 ≈ 1.29)', () => {
    const doc = load('polytropic.json');
    doc.process = { claimed: 'adiabatic' };
    expect(flagsOf(doc, 'INDEX_FAR_FROM_CLAIM')).toHaveLength(1);
  });
  it('does not raise for the claimed polytropic index', () => {
    expect(codes(load('polytropic.json'))).not.toContain('INDEX_FAR_FROM_CLAIM');
  });
});
