import { checkRunDocument, validateRunDocument } from '../engine';
import { loadFixture } from '../../testing/fixture-runs';
import { documentToStorage, storageToDocument, type DocumentContext } from './run-document-mapper';

// Issue 12: the barometer is an instrument of the register; a stored run names it and the document carries it.
describe('a register barometer in a stored run', () => {
  it('becomes the document\'s ambient.pressure.instrument, described in the pressure unit typed, with its own budget row', () => {
    const doc = loadFixture('isobaric'); // gauge pressure: the barometric pressure enters W and n
    const { setup, rows } = documentToStorage(doc);
    setup.ambient = { ...setup.ambient, pressure: { value: 1014.2, unit: 'hPa', instrumentId: 7 } };
    const barometer = {
      id: 7, tag: 'BA-1', name: 'Barometer, Lab B wall', kind: 'pressure', manufacturer: 'Kestrel Gauges', serialNumber: 'KG-20931',
      unit: 'mbar', rangeMin: 800, rangeMax: 1100, spec: { percentOfReading: 0.02, resolution: 0.1 },
      calibration: { expandedUncertainty: 0.3, coverageFactor: 2, calibratedOn: '2025-09-01', dueOn: '2026-09-01' },
    } as unknown as DocumentContext['register'] extends ReadonlyMap<number, infer V> ? V : never;
    const ctx = {
      run: { code: 'R-1', revision: 1, title: 't', runDate: doc.runDate, process: 'isobaric', setup },
      rows, register: new Map([[7, barometer]]), gasCode: 'N2', apparatus: null, lab: 'lab', operator: 'op',
    } as unknown as DocumentContext;
    const out = storageToDocument(ctx);
    expect(out.ambient.pressure).toEqual({ value: 1014.2, unit: 'hPa', instrument: 'BA-1' });
    // mbar = hPa (SI prefix hecto), so the register's 0.3 mbar calibration is 0.3 hPa
    expect(out.instruments.find((i) => i.id === 'BA-1')!.calibration).toEqual({ U: 0.3, k: 2 });
    const res = checkRunDocument(out, { draws: 0 });
    if (!res.ok) throw new Error(JSON.stringify(res.errors));
    const row = res.result.budget.find((b) => b.group === 'BA-1')!;
    // u² = (0.02 %/√3 × 1014.2)² + (0.3/2)² + (0.1/√12)² hPa² (GUM 4.3.7, 7.2.3, F.2.2.1), in Pa
    const u = 100 * Math.hypot((0.0002 / Math.sqrt(3)) * 1014.2, 0.15, 0.1 / Math.sqrt(12));
    expect(row.u).toBeCloseTo(u, 9);
  });
});

describe('readings typed in milliseconds (issue 12)', () => {
  it('are stored in seconds and read back in ms', () => {
    const doc = loadFixture('isochoric');
    const ms = { ...doc, readings: { ...doc.readings, time: { unit: 'ms' as const, values: (doc.readings.time.values as number[]).map((t) => t * 1000) } } };
    const { rows, setup } = documentToStorage(ms);
    expect(rows[1].time).toBe(1); // 1000 ms = 1 s (SI prefix milli)
    const ctx = { run: { code: 'R-2', revision: 1, title: 't', runDate: doc.runDate, process: 'isochoric', setup }, rows, register: new Map(), gasCode: 'He', apparatus: null, lab: 'l', operator: 'o' } as unknown as DocumentContext;
    expect(storageToDocument(ctx).readings.time).toEqual(ms.readings.time);
  });
});

describe('a register certificate\'s corrections in a stored run\'s document', () => {
  const thermometer = (corrections: Record<string, number>) => ({
    id: 9, tag: 'TC-9', name: 'Pt100 probe, bath calorimeter', kind: 'temperature', manufacturer: '', serialNumber: '', unit: 'degC', rangeMin: null, rangeMax: null, spec: { resolution: 0.001 },
    calibration: { expandedUncertainty: 0.01, coverageFactor: 2, calibratedOn: '2025-12-01', dueOn: '2026-12-01', certificate: 'HIAT-CAL-2310', corrections },
  }) as unknown as DocumentContext['register'] extends ReadonlyMap<number, infer V> ? V : never;
  const documentWith = (corrections: Record<string, number>) => {
    const doc = loadFixture('isochoric'); // temperature entered in °F
    const { setup, rows } = documentToStorage(doc);
    setup.channels!.temperature = { unit: 'degF', instrumentId: 9 };
    const ctx = { run: { code: 'R-3', revision: 1, title: 't', runDate: doc.runDate, process: 'isochoric', setup }, rows, register: new Map([[9, thermometer(corrections)]]), gasCode: 'He', apparatus: null, lab: 'l', operator: 'o' } as unknown as DocumentContext;
    return storageToDocument(ctx);
  };

  it('carry the certificate\'s gain and offset as stated, in the instrument\'s unit, beside U converted to the channel\'s', () => {
    const tc = documentWith({ gain: 1.0004, offset: -0.05 }).instruments.find((i) => i.id === 'TC-9')!;
    // U: 0.01 °C is 0.018 °F (a temperature difference of 1 °C is 1.8 °F, NIST SP 811 B.8); the correction stays in °C.
    expect(tc.calibration!.U).toBeCloseTo(0.018, 12);
    expect(tc.calibration!.correction).toEqual({ certificate: 'HIAT-CAL-2310', gain: 1.0004, offset: -0.05, unit: 'degC' });
  });

  it('add nothing to the document when the certificate states none (a demo run\'s document and hash stay as they were)', () => {
    expect(documentWith({}).instruments.find((i) => i.id === 'TC-9')!.calibration).toEqual({ U: expect.any(Number), k: 2 });
  });

  it('read a null the register once kept as "not stated": the document stays one the check can read', () => {
    const doc = documentWith({ gain: null, offset: -0.05 } as unknown as Record<string, number>);
    expect(doc.instruments.find((i) => i.id === 'TC-9')!.calibration!.correction).toEqual({ certificate: 'HIAT-CAL-2310', offset: -0.05, unit: 'degC' });
    expect(validateRunDocument(doc).ok).toBe(true);
    expect(documentWith({ gain: null, offset: null } as unknown as Record<string, number>).instruments.find((i) => i.id === 'TC-9')!.calibration).toEqual({ U: expect.any(Number), k: 2 });
  });
});
