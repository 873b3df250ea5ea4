import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { checkRunDocument } from './balance';
import { validateRunDocument } from './run-document';

const load = (name: string) => JSON.parse(readFileSync(join(__dirname, '..', '..', 'fixtures', 'runs', name), 'utf8'));
const paths = (input: unknown) => {
  const v = validateRunDocument(input);
  return v.ok ? [] : v.errors.map((e) => e.path);
};

describe('run document validation', () => {
  it('accepts every demo fixture', () => {
    for (const f of ['isothermal', 'adiabatic', 'isobaric', 'isochoric', 'polytropic', 'calorimetric']) {
      expect(paths(load(`${f}.json`))).toEqual([]);
    }
  });
  it('refuses a non-object and a wrong format or version', () => {
    expect(paths(42)).toEqual(['']);
    expect(paths({ ...load('isothermal.json'), format: 'other', version: 2 })).toEqual(['format', 'version']);
  });
  it('names the reading that is not a number, 0-based as in JSON', () => {
    const doc = load('isothermal.json');
    doc.readings.pressure.values[12] = 'n/a';
    const v = validateRunDocument(doc);
    expect(v.ok).toBe(false);
    if (!v.ok) expect(v.errors).toEqual([{ path: 'readings.pressure[12]', message: 'must be a finite number, got "n/a"' }]);
  });
  it('refuses gauge pressure without a barometric reading, saying why', () => {
    const doc = load('isobaric.json');
    delete doc.ambient.pressure;
    const v = validateRunDocument(doc);
    expect(v.ok).toBe(false);
    if (!v.ok) expect(v.errors[0]).toEqual({ path: 'ambient.pressure', message: expect.stringMatching(/gauge.*barometric/) });
  });
  it('lists every problem at once: unknown unit, channel length, missing bore, bad instrument reference, bad date', () => {
    const doc = load('isothermal.json');
    doc.readings.temperature.unit = 'celsius';
    doc.readings.voltage.values.pop();
    delete doc.apparatus.pistonBore;
    doc.readings.current.instrument = 'DM-99';
    doc.instruments[0].dueDate = '03/11/2026';
    doc.runDate = 'yesterday';
    expect(paths(doc).sort()).toEqual(['apparatus.pistonBore', 'instruments[0].dueDate', 'readings.current.instrument', 'readings.temperature.unit', 'readings.voltage.values', 'runDate'].sort());
  });
  it('needs the index of a polytropic run, volume readings for a work process and C for a calorimeter', () => {
    const poly = load('polytropic.json');
    delete poly.process.index;
    expect(paths(poly)).toEqual(['process.index']);
    const iso = load('isothermal.json');
    delete iso.readings.displacement;
    expect(paths(iso)).toEqual(['readings.volume', 'amount']); // n from the initial state needs V too
    const cal = load('calorimetric.json');
    delete cal.apparatus.heatCapacity;
    expect(paths(cal)).toEqual(['apparatus.heatCapacity']);
  });
  it('checkRunDocument turns a temperature outside the NASA polynomials\' range into a path and message', () => {
    const doc = load('polytropic.json'); // CO2: NASA/TP-2002-211556 polynomials start at 200 K
    doc.readings.temperature.values[0] = 190;
    const res = checkRunDocument(doc, { draws: 0 });
    expect(res.ok).toBe(false);
    if (!res.ok) expect(res.errors).toEqual([{ path: 'readings.temperature[0]', message: expect.stringMatching(/200 K to 6000 K; 190.00 K is outside/) }]);
  });
  it('refuses settings the engine cannot honour, beside document errors', () => {
    const res = checkRunDocument(load('isothermal.json'), { coverageFactor: 0, draws: 1.5, indeterminateFraction: -1 });
    expect(res.ok).toBe(false);
    if (!res.ok) expect(res.errors.map((e) => e.path)).toEqual(['settings.coverageFactor', 'settings.draws', 'settings.indeterminateFraction']);
  });
});
