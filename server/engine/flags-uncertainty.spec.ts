// Issue 12: flags that test against propagated uncertainty, heater consistency, channels without an instrument,
// and the likely cause of a break named among the flags.
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { checkRunDocument, type BalanceResult, type BalanceSettings } from './balance';
import type { FlagCode } from './flags';
import { createRng } from './random';

const load = (name: string) => JSON.parse(readFileSync(join(__dirname, '..', '..', 'fixtures', 'runs', name), 'utf8'));
const evaluate = (doc: unknown, settings: BalanceSettings = {}): BalanceResult => {
  const res = checkRunDocument(doc, { draws: 0, ...settings });
  if (!res.ok) throw new Error(JSON.stringify(res.errors));
  return res.result;
};
const flagsOf = (doc: unknown, code: FlagCode, settings: BalanceSettings = {}) => evaluate(doc, settings).flags.filter((f) => f.code === code);

describe('drift and index flags against the propagated uncertainty (finding 6)', () => {
  it('thermometer noise alone does not raise ISOTHERMAL_DRIFT; the same noise on a 6 K drift does', () => {
    // Noise of 1.2 K standard deviation, stated in the thermometer's repeatability: the span of single readings
    // (about 6.5 σ for 201 readings, common practice for the range of normal samples) exceeds 1 % of 300 K.
    const rng = createRng(7);
    const doc = load('isothermal.json');
    const inst = doc.instruments.find((i: { id: string }) => i.id === 'TC-7');
    inst.repeatability = 1.2;
    const noise = doc.readings.temperature.values.map(() => 1.2 * rng.normal());
    doc.readings.temperature.values = doc.readings.temperature.values.map((t: number, i: number) => t + noise[i]);
    const T = doc.readings.temperature.values as number[];
    expect(Math.max(...T) - Math.min(...T)).toBeGreaterThan(3); // the old fixed test (span > 1 % of T) would flag
    expect(flagsOf(doc, 'ISOTHERMAL_DRIFT')).toEqual([]);
    doc.readings.temperature.values = T.map((t, i) => t + (6 * i) / 200);
    expect(flagsOf(doc, 'ISOTHERMAL_DRIFT')).toHaveLength(1);
  });
  it('a pressure offset within the transducer\'s stated uncertainty does not raise INDEX_FAR_FROM_CLAIM', () => {
    // A +5 kPa zero offset bends ln P on ln V; the transducer's calibration states u = 3 kPa (U = 6 kPa, k = 2).
    const doc = load('isothermal.json');
    const inst = doc.instruments.find((i: { id: string }) => i.id === 'PG-2');
    inst.calibration = { U: 6, k: 2 };
    doc.readings.pressure.values = doc.readings.pressure.values.map((p: number) => p + 5);
    const r = evaluate(doc);
    expect(Math.abs(r.polytropicFit!.index - 1)).toBeGreaterThan(0.05); // the old test (> 3 u_fit and > 0.05) flags
    expect(r.flags.filter((f) => f.code === 'INDEX_FAR_FROM_CLAIM')).toEqual([]);
  });
  it('the thresholds are lab settings: a tighter drift fraction flags what the default passes', () => {
    const doc = load('isothermal.json');
    doc.readings.temperature.values = doc.readings.temperature.values.map((t: number, i: number) => t + (1 * i) / 200);
    expect(flagsOf(doc, 'ISOTHERMAL_DRIFT')).toEqual([]);
    expect(flagsOf(doc, 'ISOTHERMAL_DRIFT', { isothermalDriftFraction: 0.001 })).toHaveLength(1);
    const bad = checkRunDocument(doc, { flagCoverage: -1 });
    expect(bad.ok).toBe(false);
    if (!bad.ok) expect(bad.errors.map((e) => e.path)).toEqual(['settings.flagCoverage']);
  });
});

describe('heater consistency (finding 3)', () => {
  it('current with 0 V applied raises HEATER_CURRENT_WITHOUT_VOLTAGE and names the voltage channel', () => {
    const doc = load('calorimetric.json');
    // readings 101–200: the voltage logged from an idle input while the heater runs
    doc.readings.voltage.values = doc.readings.voltage.values.map((u: number, i: number) => (i >= 100 && i < 200 ? 0 : u));
    const r = evaluate(doc);
    const f = r.flags.filter((x) => x.code === 'HEATER_CURRENT_WITHOUT_VOLTAGE');
    expect(f.map((x) => x.reading)).toEqual([101]);
    expect(r.hints.find((h) => h.code === 'HEATER_CHANNEL_SUSPECT')!.message).toMatch(/voltage channel is likely read from the wrong input/);
  });
  it('U/I wandering from 14 to 20 Ω raises HEATER_RESISTANCE_UNSTEADY and names the current channel', () => {
    const doc = load('calorimetric.json');
    // heater on for readings 61–360 at 12 V; the current channel drifts so that U/I goes from 14 to 20 Ω
    doc.readings.current.values = doc.readings.current.values.map((c: number, i: number) => (i >= 60 && i < 360 ? 12000 / (14 + (6 * (i - 60)) / 299) : c));
    const r = evaluate(doc);
    const f = r.flags.filter((x) => x.code === 'HEATER_RESISTANCE_UNSTEADY');
    expect(f).toHaveLength(1);
    expect(f[0].message).toMatch(/from 14\.\d+ Ω to 19\.\d+ Ω/);
    expect(r.hints.find((h) => h.code === 'HEATER_CHANNEL_SUSPECT')!.message).toMatch(/the current is likely read from the wrong channel/);
  });
  it('a steady heater with noisy meters raises neither', () => {
    const r = evaluate(load('calorimetric.json'));
    expect(r.flags).toEqual([]);
    expect(r.hints).toEqual([]);
  });
});

describe('a channel with no instrument (finding 5)', () => {
  it('raises a blocking UNCERTAINTY_NOT_STATED naming the channel', () => {
    const doc = load('isobaric.json');
    delete doc.readings.volume.instrument;
    const f = flagsOf(doc, 'UNCERTAINTY_NOT_STATED');
    expect(f).toHaveLength(1);
    expect(f[0].blocking).toBe(true);
    expect(f[0].message).toMatch(/volume channel names no instrument/);
  });
});

describe('a break\'s likely cause is named among the flags (heater hint item)', () => {
  it('the forgotten heat leak raises LIKELY_CAUSE with the fitted h', () => {
    const r = evaluate(load('calorimetric-heat-leak-forgotten.json'));
    expect(r.verdict).toBe('breaks');
    const f = r.flags.filter((x) => x.code === 'LIKELY_CAUSE');
    expect(f).toHaveLength(1);
    expect(f[0].message).toMatch(/FORGOTTEN_HEAT_LEAK.*h = 0\.07\d* W\/K/);
  });
});
