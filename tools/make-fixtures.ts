// Writes the demo run documents in fixtures/runs/ from the ideal-gas model plus modest instrument noise.
// Every number here is invented for the demo lab (Harrowgate Institute of Applied Thermophysics, Calorimetry
// Lab B); nothing is a measurement. Run: npx tsx --tsconfig tsconfig.server.json tools/make-fixtures.ts
import { writeFileSync, mkdirSync } from 'node:fs';
import { join } from 'node:path';
import { cv, speciesModel, equipartitionModel, type HeatCapacityModel } from '../server/engine/gases';
import { createRng } from '../server/engine/random';
import { criticalConstants, departureAtPressure } from '../server/engine/real-gas';
import { R_GAS, fromSi, pistonArea } from '../server/engine/units';

const OUT = join(__dirname, '..', 'fixtures', 'runs');
const LAB = 'Harrowgate Institute of Applied Thermophysics, Calorimetry Lab B';
const rng = createRng(20260314);

const quantise = (x: number, step: number) => Number((Math.round(x / step) * step).toFixed(Math.max(0, -Math.floor(Math.log10(step)) + 1)));
const noisy = (x: number, sd: number, step: number) => quantise(x + sd * rng.normal(), step);

const INSTRUMENTS = {
  pg2: { id: 'PG-2', name: 'Pressure transducer, piston cell', percentOfReading: 0.05, percentOfFullScale: 0.02, fullScale: 1000, resolution: 0.01, repeatability: 0.02, range: { min: 0, max: 1000 }, calibration: { U: 0.1, k: 2 }, calibrationDate: '2025-11-03', dueDate: '2026-11-03' },
  pg5: { id: 'PG-2', name: 'Pressure transducer, piston cell', percentOfReading: 0.05, percentOfFullScale: 0.02, fullScale: 2, resolution: 0.0001, repeatability: 0.0002, range: { min: -1, max: 2 }, calibration: { U: 0.0005, k: 2 }, calibrationDate: '2025-09-20', dueDate: '2026-09-20' },
  pg7: { id: 'PG-2', name: 'Pressure transducer, piston cell', percentOfReading: 0.05, fullScale: 100, percentOfFullScale: 0.02, resolution: 0.001, repeatability: 0.002, range: { min: 0, max: 100 }, calibration: { U: 0.005, k: 2 }, calibrationDate: '2026-01-12', dueDate: '2027-01-12' },
  ld1: { id: 'LD-3', name: 'Displacement encoder, piston PC-3', percentOfReading: 0.02, resolution: 0.01, range: { min: 0, max: 400 }, calibration: { U: 0.02, k: 2 }, calibrationDate: '2025-10-01', dueDate: '2026-10-01' },
  tc7: { id: 'TC-7', name: 'Pt100 probe, piston cell', resolution: 0.01, repeatability: 0.01, calibration: { U: 0.05, k: 2 }, range: { min: 70, max: 500 }, calibrationDate: '2025-12-01', dueDate: '2026-12-01' },
  tc9: { id: 'TC-9', name: 'Pt100 probe, bath calorimeter', resolution: 0.001, repeatability: 0.002, calibration: { U: 0.01, k: 2 }, range: { min: 0, max: 50 }, calibrationDate: '2025-12-01', dueDate: '2026-12-01' },
  tf3: { id: 'TC-7', name: 'Pt100 probe, piston cell', resolution: 0.01, repeatability: 0.02, calibration: { U: 0.1, k: 2 }, range: { min: -40, max: 300 }, calibrationDate: '2025-08-15', dueDate: '2026-08-15' },
  // The meters' repeatability is the noise drawn below for their readings (their specification states it).
  dm4: { id: 'DV-4', name: 'Bench multimeter, heater voltage', percentOfReading: 0.02, resolution: 0.001, repeatability: 0.0003, range: { min: -0.1, max: 30 }, calibration: { U: 0.002, k: 2 }, calibrationDate: '2025-07-01', dueDate: '2026-07-01' },
  dm6: { id: 'DA-5', name: 'Bench multimeter, heater current', percentOfReading: 0.05, resolution: 0.01, repeatability: 0.05, range: { min: -10, max: 3000 }, calibration: { U: 0.05, k: 2 }, calibrationDate: '2025-07-01', dueDate: '2026-07-01' },
};

function header(id: string, title: string, claimed: string, extra: Record<string, unknown> = {}) {
  return { format: 'qwell.run', version: 1, id, title, lab: LAB, operator: 'Lena Okonkwo', runDate: '2026-03-14', process: { claimed, ...extra } };
}

function write(name: string, doc: unknown): void {
  mkdirSync(OUT, { recursive: true });
  writeFileSync(join(OUT, name), JSON.stringify(doc, null, 1) + '\n');
  console.log(`wrote fixtures/runs/${name}`);
}

/** Reversible adiabat of an ideal gas with Cv(T): dT/dV = −R·T/(V·Cv(T)), fourth-order Runge–Kutta. */
function adiabatT(model: HeatCapacityModel, T0: number, V0: number, V1: number, steps = 4000): (V: number) => number {
  const f = (V: number, T: number) => (-R_GAS * T) / (V * cv(model, T));
  const table: Array<[number, number]> = [[V0, T0]];
  let T = T0;
  const h = (V1 - V0) / steps;
  for (let i = 0; i < steps; i++) {
    const V = V0 + i * h;
    const k1 = f(V, T), k2 = f(V + h / 2, T + (h * k1) / 2), k3 = f(V + h / 2, T + (h * k2) / 2), k4 = f(V + h, T + h * k3);
    T += (h * (k1 + 2 * k2 + 2 * k3 + k4)) / 6;
    table.push([V + h, T]);
  }
  return (V) => {
    const i = Math.min(steps - 1, Math.max(0, Math.floor((V - V0) / h)));
    const [va, ta] = table[i];
    const [vb, tb] = table[i + 1];
    return ta + ((tb - ta) * (V - va)) / (vb - va);
  };
}

// Piston cell PC-3: 80 mm bore, 0.5 L dead volume.
const BORE = 0.08;
const AREA = pistonArea(BORE);
const DEAD = 0.5e-3;
const pistonApparatus = (extra: Record<string, unknown> = {}) => ({
  name: 'Piston cell PC-3', pistonBore: { value: 80, unit: 'mm', u: 0.01 }, deadVolume: { value: 0.5, unit: 'L', u: 0.002 },
  ratedPressure: { value: 10, unit: 'bar' }, ...extra,
});

/** The piston cell's heater element (invented): 20 Ω. */
const HEATER_OHMS = 20;

function isothermal(): void {
  const n = 0.04, T = 300, N = 201, dt = 1;
  const x0 = 0.1, x1 = 0.3; // m of piston travel
  const t: number[] = [], p: number[] = [], x: number[] = [], temp: number[] = [], u: number[] = [], i: number[] = [];
  for (let k = 0; k < N; k++) {
    const xs = x0 + ((x1 - x0) * k) / (N - 1);
    const V = DEAD + AREA * xs;
    const P = (n * R_GAS * T) / V;
    const power = (P * AREA * (x1 - x0)) / ((N - 1) * dt); // heater matches P·dV/dt to hold T
    const volts = Math.sqrt(power * HEATER_OHMS); // a fixed heater resistance: U = √(P·R), I = U/R
    t.push(k * dt);
    p.push(noisy(P / 1000, 0.02, 0.01));
    x.push(noisy(xs * 1000, 0.005, 0.01));
    temp.push(noisy(T - 273.15, 0.01, 0.01));
    u.push(noisy(volts, 0.0003, 0.001));
    i.push(noisy((power / volts) * 1000, 0.005, 0.01));
  }
  write('isothermal.json', {
    ...header('HIAT-B-2026-031', 'Isothermal expansion of nitrogen, heater-held at 300 K', 'isothermal'),
    gas: { model: 'species', species: 'N2' },
    amount: { from: 'initialState', Z: 1 },
    ambient: { pressure: { value: 101.42, unit: 'kPa', u: 0.03 }, temperature: { value: 26.85, unit: 'degC', u: 0.1 } },
    apparatus: pistonApparatus({ heatLossCoefficient: { value: 0.01, unit: 'W/K', u: 0.002 } }),
    instruments: [INSTRUMENTS.pg2, INSTRUMENTS.ld1, { ...INSTRUMENTS.tc7, range: { min: -200, max: 200 } }, INSTRUMENTS.dm4, INSTRUMENTS.dm6],
    readings: {
      time: { unit: 's', values: t },
      pressure: { unit: 'kPa', reference: 'absolute', instrument: 'PG-2', values: p },
      displacement: { unit: 'mm', instrument: 'LD-3', values: x },
      temperature: { unit: 'degC', instrument: 'TC-7', values: temp },
      voltage: { unit: 'V', instrument: 'DV-4', values: u },
      current: { unit: 'mA', instrument: 'DA-5', values: i },
    },
  });
}

function adiabatic(): void {
  const model = speciesModel('air');
  const n = 0.04, T0 = 300, N = 121;
  const x0 = 0.1, x1 = 0.3;
  const V0 = DEAD + AREA * x0, V1 = DEAD + AREA * x1;
  const Tof = adiabatT(model, T0, V0, V1);
  const t: number[] = [], p: number[] = [], x: number[] = [], temp: number[] = [];
  for (let k = 0; k < N; k++) {
    const xs = x0 + ((x1 - x0) * k) / (N - 1);
    const V = DEAD + AREA * xs;
    const T = Tof(V);
    t.push(k * 0.05);
    p.push(noisy((n * R_GAS * T) / V / 1000, 0.02, 0.01));
    x.push(noisy(xs * 1000, 0.005, 0.01));
    temp.push(noisy(T, 0.01, 0.01));
  }
  write('adiabatic.json', {
    ...header('HIAT-B-2026-032', 'Rapid adiabatic expansion of dry air', 'adiabatic'),
    gas: { model: 'species', species: 'air' },
    amount: { from: 'moles', value: 0.04, u: 0.0001 },
    ambient: { pressure: { value: 101.42, unit: 'kPa', u: 0.03 }, temperature: { value: 300, unit: 'K', u: 0.1 } },
    apparatus: pistonApparatus(),
    instruments: [INSTRUMENTS.pg2, INSTRUMENTS.ld1, { ...INSTRUMENTS.tc7, id: 'TC-7', name: 'Pt100 probe, piston cell', range: { min: 70, max: 500 } }],
    readings: {
      time: { unit: 's', values: t },
      pressure: { unit: 'kPa', reference: 'absolute', instrument: 'PG-2', values: p },
      displacement: { unit: 'mm', instrument: 'LD-3', values: x },
      temperature: { unit: 'K', instrument: 'TC-7', values: temp },
    },
  });
}

function isobaric(): void {
  const model = speciesModel('N2');
  const n = 0.05, Pabs = 250e3, baro = 101.42e3, Ta = 295, h = 0.005;
  const N = 151, dt = 1, Pel = 0.6;
  let T = 295;
  const t: number[] = [], p: number[] = [], v: number[] = [], temp: number[] = [], pw: number[] = [];
  for (let k = 0; k < N; k++) {
    if (k > 0) {
      // n·Cp·dT/dt = P_el − h·(T − T_amb), integrated in fine substeps (isobaric heating).
      for (let s = 0; s < 100; s++) T += ((Pel - h * (T - Ta)) * (dt / 100)) / (n * model.cp(T));
    }
    const V = (n * R_GAS * T) / Pabs;
    t.push(k * dt);
    p.push(noisy((Pabs - baro) / 1e5, 0.0002, 0.0001));
    v.push(noisy(V * 1e6, 0.1, 0.1));
    temp.push(noisy(T, 0.01, 0.01));
    pw.push(noisy(Pel, 0.0005, 0.0001));
  }
  write('isobaric.json', {
    ...header('HIAT-B-2026-033', 'Isobaric electrical heating of nitrogen under a weighted piston', 'isobaric'),
    gas: { model: 'species', species: 'N2' },
    amount: { from: 'moles', value: n, u: 0.0002 },
    ambient: { pressure: { value: 101.42, unit: 'kPa', u: 0.03 }, temperature: { value: 295, unit: 'K', u: 0.1 } },
    apparatus: { name: 'Piston cell PC-3 (syringe scale)', heatLossCoefficient: { value: h, unit: 'W/K', u: 0.0005 } },
    instruments: [INSTRUMENTS.pg5, { id: 'SV-1', name: 'Syringe volume scale, piston cell', resolution: 0.1, percentOfReading: 0.1 }, INSTRUMENTS.tc7,
      { id: 'PM-2', name: 'Heater power meter, piston cell', percentOfReading: 0.1, resolution: 0.0001, calibration: { U: 0.0005, k: 2 } }],
    readings: {
      time: { unit: 's', values: t },
      pressure: { unit: 'bar', reference: 'gauge', instrument: 'PG-2', values: p },
      volume: { unit: 'mL', instrument: 'SV-1', values: v },
      temperature: { unit: 'K', instrument: 'TC-7', values: temp },
      power: { unit: 'W', instrument: 'PM-2', values: pw },
    },
  });
}

function isochoric(): void {
  const model = equipartitionModel(3);
  const n = 0.06, V = 1.5e-3, Ta = 296, h = 0.002, Pel = 0.25;
  const N = 121, dt = 1;
  let T = 296;
  const t: number[] = [], p: number[] = [], temp: number[] = [], u: number[] = [], i: number[] = [];
  for (let k = 0; k < N; k++) {
    if (k > 0) for (let s = 0; s < 100; s++) T += ((Pel - h * (T - Ta)) * (dt / 100)) / (n * cv(model, T));
    t.push(k * dt);
    p.push(noisy(fromSi('pressure', 'psi', (n * R_GAS * T) / V), 0.002, 0.001));
    temp.push(noisy(fromSi('temperature', 'degF', T), 0.02, 0.01));
    u.push(noisy(5, 0.0003, 0.001));
    i.push(noisy((Pel / 5) * 1000, 0.005, 0.01));
  }
  write('isochoric.json', {
    ...header('HIAT-B-2026-034', 'Constant-volume heating of helium in a rigid vessel', 'isochoric'),
    gas: { model: 'species', species: 'He' },
    amount: { from: 'mass', mass: { value: 0.2402, unit: 'g', u: 0.0002 } },
    ambient: { pressure: { value: 760.2, unit: 'mmHg', u: 0.3 }, temperature: { value: 22.85, unit: 'degC', u: 0.1 } },
    apparatus: { name: 'Rigid vessel RV-2', vesselVolume: { value: 1.5, unit: 'L', u: 0.003 }, heatLossCoefficient: { value: h, unit: 'W/K', u: 0.0003 }, ratedPressure: { value: 150, unit: 'psi' } },
    instruments: [INSTRUMENTS.pg7, INSTRUMENTS.tf3, INSTRUMENTS.dm4, INSTRUMENTS.dm6],
    readings: {
      time: { unit: 's', values: t },
      pressure: { unit: 'psi', reference: 'absolute', instrument: 'PG-2', values: p },
      temperature: { unit: 'degF', instrument: 'TC-7', values: temp },
      voltage: { unit: 'V', instrument: 'DV-4', values: u },
      current: { unit: 'mA', instrument: 'DA-5', values: i },
    },
  });
}

function polytropic(): void {
  const model = speciesModel('CO2');
  const index = 1.2, n = 0.04, T0 = 300, Ta = 300, N = 101, dt = 0.5;
  const x0 = 0.3, x1 = 0.1; // compression
  const V0 = DEAD + AREA * x0;
  const P0 = (n * R_GAS * T0) / V0;
  const ts: number[] = [], Ts: number[] = [], Ps: number[] = [], xs: number[] = [];
  for (let k = 0; k < N; k++) {
    const x = x0 + ((x1 - x0) * k) / (N - 1);
    const V = DEAD + AREA * x;
    const P = P0 * (V0 / V) ** index; // P·V^n = const
    ts.push(k * dt); xs.push(x); Ps.push(P); Ts.push((P * V) / (n * R_GAS));
  }
  // Heat that must leave for this path, Q = ΔU + W, carried by the leak h·∫(T − T_amb)dt.
  const V1 = DEAD + AREA * x1;
  const W = (P0 * V0 - Ps[N - 1] * V1) / (index - 1);
  // ΔU of the real gas: the ideal ∫Cv dT plus the engine's second-virial departure (server/engine/real-gas.ts).
  const co2 = criticalConstants('CO2')!;
  const dU = n * (model.cpIntegral(T0, Ts[N - 1]) - R_GAS * (Ts[N - 1] - T0))
    + n * (departureAtPressure(co2, Ts[N - 1], Ps[N - 1]) - departureAtPressure(co2, T0, P0));
  let leakInt = 0;
  for (let k = 0; k + 1 < N; k++) leakInt += 0.5 * (Ts[k] + Ts[k + 1] - 2 * Ta) * dt;
  const h = -(dU + W) / leakInt;
  write('polytropic.json', {
    ...header('HIAT-B-2026-035', 'Polytropic compression of carbon dioxide (n = 1.2)', 'polytropic', { index }),
    gas: { model: 'species', species: 'CO2' },
    amount: { from: 'mass', mass: { value: 1.7604, unit: 'g', u: 0.001 } },
    ambient: { pressure: { value: 1.0142, unit: 'bar', u: 0.0003 }, temperature: { value: Ta, unit: 'K', u: 0.05 } },
    apparatus: pistonApparatus({ heatLossCoefficient: { value: Number(h.toPrecision(4)), unit: 'W/K', u: Number((0.01 * h).toPrecision(2)) } }),
    instruments: [{ ...INSTRUMENTS.pg7, id: 'PG-2', fullScale: 10, resolution: 0.0001, repeatability: 0.0002, calibration: { U: 0.0005, k: 2 }, range: { min: 0, max: 10 } }, INSTRUMENTS.ld1, INSTRUMENTS.tc7],
    readings: {
      time: { unit: 's', values: ts },
      pressure: { unit: 'bar', reference: 'absolute', instrument: 'PG-2', values: Ps.map((P) => noisy(P / 1e5, 0.0002, 0.0001)) },
      displacement: { unit: 'mm', instrument: 'LD-3', values: xs.map((x) => noisy(x * 1000, 0.005, 0.01)) },
      temperature: { unit: 'K', instrument: 'TC-7', values: Ts.map((T) => noisy(T, 0.01, 0.01)) },
    },
  });
}

function calorimetric(name: string, forgetLeak: boolean): void {
  const C = 4500, Ta = 293.15, h = 0.08, N = 601, dt = 1;
  let T = 293.15;
  const t: string[] = [], temp: number[] = [], u: number[] = [], i: number[] = [];
  const start = Date.parse('2026-03-14T09:30:00Z');
  for (let k = 0; k < N; k++) {
    const on = k >= 60 && k < 360; // heater on for 300 s
    const volts = on ? 12 : 0, amps = on ? 1.5 : 0;
    if (k > 0) for (let s = 0; s < 20; s++) T += ((volts * amps - h * (T - Ta)) * (dt / 20)) / C;
    t.push(new Date(start + k * dt * 1000).toISOString());
    temp.push(noisy(T - 273.15, 0.001, 0.001));
    u.push(noisy(volts, 0.0003, 0.001));
    i.push(noisy(amps * 1000, 0.05, 0.01));
  }
  const apparatus: Record<string, unknown> = { name: 'Bath calorimeter BC-1', heatCapacity: { value: 4.5, unit: 'kJ/K', u: 0.004 } };
  if (!forgetLeak) apparatus['heatLossCoefficient'] = { value: h, unit: 'W/K', u: 0.004 };
  write(name, {
    ...header(forgetLeak ? 'HIAT-B-2026-037' : 'HIAT-B-2026-036',
      forgetLeak ? 'Electrical calibration check of BC-1, entered without its heat-loss coefficient' : 'Electrical calibration check of Bath calorimeter BC-1', 'calorimetric'),
    gas: { model: 'calorimeter' },
    ambient: { temperature: { value: 20, unit: 'degC', u: 0.05 } },
    apparatus,
    instruments: [INSTRUMENTS.tc9, INSTRUMENTS.dm4, INSTRUMENTS.dm6],
    readings: {
      time: { unit: 'iso', values: t },
      temperature: { unit: 'degC', instrument: 'TC-9', values: temp },
      voltage: { unit: 'V', instrument: 'DV-4', values: u },
      current: { unit: 'mA', instrument: 'DA-5', values: i },
    },
  });
}

isothermal();
adiabatic();
isobaric();
isochoric();
polytropic();
calorimetric('calorimetric.json', false);
calorimetric('calorimetric-heat-leak-forgotten.json', true);
