// Benchmark: time and peak memory of the engine for runs of 10³…10⁶ readings, linear propagation alone and
// with 10⁵ Monte Carlo draws. Run: npx tsx --tsconfig tsconfig.server.json tools/bench-engine.ts
// Prints figures only; nothing here is asserted.
import { performance } from 'node:perf_hooks';
import { checkRunDocument, evaluateBalance, type RunDocument } from '../server/engine';
import { sha256Canonical } from '../server/engine/canonical';
import { speciesModel } from '../server/engine/gases';
import { monteCarlo } from '../server/engine/monte-carlo';
import { buildRunModel } from '../server/engine/run-model';
import { buildSeries } from '../server/engine/series';
import { R_GAS } from '../server/engine/units';
import { exitWithUsageOnHelp } from './cli-help';

exitWithUsageOnHelp(__filename);

const round = (x: number, step: number) => Number((Math.round(x / step) * step).toFixed(Math.round(-Math.log10(step))));

/** An invented heater-held isothermal expansion with N readings (ideal gas, small deterministic ripple). */
function syntheticRun(N: number): RunDocument {
  const n = 0.04, T = 300, V1 = 1e-3, V2 = 2e-3, duration = 200;
  // Packed arrays, as JSON.parse makes them (preallocated holey arrays serialise several times slower).
  const time: number[] = [], p: number[] = [], v: number[] = [], temp: number[] = [], volts: number[] = [], amps: number[] = [];
  const rate = (V2 - V1) / duration;
  for (let i = 0; i < N; i++) {
    const t = (duration * i) / (N - 1);
    const V = V1 + rate * t;
    const P = (n * R_GAS * T) / V;
    const ripple = Math.sin(i * 12.9898) * 1e-4;
    // Rounded as a logger writes them (a few significant digits), which is also what JSON carries.
    time.push(round(t, 1e-5));
    p.push(round((P / 1000) * (1 + ripple), 1e-3));
    v.push(round(V * 1000, 1e-6));
    temp.push(round(T + ripple, 1e-3));
    volts.push(3.2);
    amps.push(round((P * rate) / 3.2, 1e-6));
  }
  return {
    format: 'qwell.run', version: 1, runDate: '2026-03-14', title: `benchmark run of ${N} readings`,
    process: { claimed: 'isothermal' }, gas: { model: 'species', species: 'N2' }, amount: { from: 'initialState' },
    ambient: { pressure: { value: 101.3, unit: 'kPa', u: 0.03 }, temperature: { value: 300, unit: 'K', u: 0.1 } },
    apparatus: { name: 'Piston cell PC-3', heatLossCoefficient: { value: 0.01, unit: 'W/K', u: 0.002 } },
    instruments: [
      { id: 'PG-2', percentOfReading: 0.05, percentOfFullScale: 0.02, fullScale: 1000, resolution: 0.01, calibration: { U: 0.1, k: 2 } },
      { id: 'SV-1', percentOfReading: 0.1, resolution: 0.001 },
      { id: 'TC-7', resolution: 0.01, repeatability: 0.01, calibration: { U: 0.05, k: 2 } },
      { id: 'DM-4', percentOfReading: 0.02, resolution: 0.001 },
      { id: 'DM-6', percentOfReading: 0.05, resolution: 0.00001 },
    ],
    readings: {
      time: { unit: 's', values: time },
      pressure: { unit: 'kPa', reference: 'absolute', instrument: 'PG-2', values: p },
      volume: { unit: 'L', instrument: 'SV-1', values: v },
      temperature: { unit: 'K', instrument: 'TC-7', values: temp },
      voltage: { unit: 'V', instrument: 'DM-4', values: volts },
      current: { unit: 'A', instrument: 'DM-6', values: amps },
    },
  };
}

const mb = (bytes: number) => (bytes / 1048576).toFixed(0);

/** The engine is synchronous, so a timer cannot sample RSS during it; RSS is read right after each step. */
function timed<T>(f: () => T): { ms: number; value: T; peakMb: string } {
  const t0 = performance.now();
  const value = f();
  const ms = performance.now() - t0;
  return { ms, value, peakMb: mb(process.memoryUsage().rss) };
}

console.log(`node ${process.version}, ${require('node:os').cpus().length} cores; times in ms, memory = RSS in MB right after each step`);
console.log('readings | validate+linear (1st call) | hash | linear (no MC) | RSS | with 1e5 MC draws | RSS | MC alone (1e5) | verdict');
evaluateBalance(syntheticRun(1000), { draws: 1000 }); // warm-up
for (const N of [1e3, 1e4, 1e5, 1e6]) {
  const doc = syntheticRun(N);
  global.gc?.();
  const validate = timed(() => checkRunDocument(doc, { draws: 0 }).ok);
  const hash = timed(() => sha256Canonical(doc));
  const linear = timed(() => evaluateBalance(doc, { draws: 0 }));
  const withMc = timed(() => evaluateBalance(doc, { draws: 100_000, seed: 1 }));
  const model = buildRunModel(buildSeries(doc), speciesModel('N2'));
  const mcOnly = timed(() => monteCarlo(model.inputs, model.residual, { draws: 100_000, seed: 1 }));
  console.log(
    `${String(N).padStart(8)} | ${validate.ms.toFixed(0).padStart(24)} | ${hash.ms.toFixed(0).padStart(4)} | ${linear.ms.toFixed(0).padStart(14)} | ${linear.peakMb.padStart(3)} | ${withMc.ms.toFixed(0).padStart(17)} | ${withMc.peakMb.padStart(3)} | ${mcOnly.ms.toFixed(0).padStart(14)} | ${withMc.value.verdict}`,
  );
}
console.log(`process peak RSS over all sizes (includes the synthetic documents themselves) (resourceUsage.maxRSS): ${(process.resourceUsage().maxRSS / 1024).toFixed(0)} MB`);
