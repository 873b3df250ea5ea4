// Turns a validated run document into SI series (Float64Array, one value per reading) and the
// uncertainty components of the instrument behind each channel.
import type { AppliedCorrection, CorrectedReading } from '../../contract/corrections';
import { correctedValues, correctionFor } from './corrections';
import { MOLAR_MASS_G } from './gases';
import { components, type UncertaintyComponents } from './instrument-uncertainty';
import type { Instrument, Quantity, RunDocument } from './run-document';
import { affineToSi, differenceToSi, isoToSeconds, pistonArea, toSi, type UnitKind } from './units';

export type ChannelKey = 'pressure' | 'volume' | 'temperature' | 'voltage' | 'current' | 'power';

export interface ChannelSeries {
  key: ChannelKey;
  /** Readable name for budgets and flags, e.g. "pressure (PG-2 (pressure transducer))". */
  label: string;
  /** Group for "halve this instrument": the instrument id, or the channel when none is named. */
  group: string;
  instrument?: Instrument;
  /** Values as entered, in the channel's unit (ranges are stated in it). */
  raw: ArrayLike<number>;
  /** Values as the check reads them: as entered, or corrected by the certificate in force (corrections.ts), channel unit. */
  values: ArrayLike<number>;
  /** The certificate's correction applied to `values`, when there is one. */
  correction: AppliedCorrection | null;
  unit: string;
  si: Float64Array;
  /** ∂SI/∂(relative gain): the part of each SI value that scales with the reading (excludes °C/gauge offsets). */
  gainBasis: Float64Array;
  /** SI per channel unit, for offsets and per-reading uncertainties. */
  factor: number;
  comps: UncertaintyComponents;
}

export interface Scalar {
  value: number;
  u: number;
  /** Budget row and group, when the value comes from an instrument of the register (the barometer). */
  label?: string;
  group?: string;
}

export interface RunSeries {
  N: number;
  t: Float64Array;
  P?: ChannelSeries;
  V?: ChannelSeries;
  T: ChannelSeries;
  U?: ChannelSeries;
  I?: ChannelSeries;
  Pw?: ChannelSeries;
  gauge: boolean;
  ambientPressure?: Scalar;
  ambientTemperature?: Scalar;
  heatLoss?: Scalar;
  wallUptake?: Scalar;
  heatCapacity?: Scalar;
  /** Relative standard uncertainty of the piston area, 2·u(d)/d. */
  boreGain?: number;
  /** Uncertainty of a volume offset common to all readings (dead volume or fixed vessel volume), m³. */
  volumeOffsetU: number;
  amount: { kind: 'moles'; n: Scalar } | { kind: 'mass'; m: Scalar; M: Scalar } | { kind: 'initialState'; Z: Scalar } | { kind: 'none' };
  /** Certificate corrections applied to the readings (channels in document order, then the barometric pressure). */
  corrections: AppliedCorrection[];
}

const NO_UNCERTAINTY: UncertaintyComponents = { gain: 0, fullScaleOffset: 0, calibrationOffset: 0, random: 0, randomDistribution: 'normal' };

function scalar(q: Quantity | undefined, kind: UnitKind): Scalar | undefined {
  if (!q) return undefined;
  return { value: toSi(kind, q.unit, q.value), u: differenceToSi(kind, q.unit, q.u ?? 0) };
}

function instrumentOf(doc: RunDocument, id: string | undefined): Instrument | undefined {
  return id === undefined ? undefined : doc.instruments?.find((i) => i.id === id);
}

function channel(doc: RunDocument, key: ChannelKey, kind: UnitKind, raw: number[], unit: string, instrumentId: string | undefined, offsetSi = 0, reading: CorrectedReading = key): ChannelSeries {
  const { factor, offset } = affineToSi(kind, unit);
  const instrument = instrumentOf(doc, instrumentId);
  // The certificate's correction, in the channel's unit, before the SI conversion (GUM 3.2.3); the entered values stay as they are.
  const correction = correctionFor(instrument, reading, kind, unit, doc.runDate);
  const values: ArrayLike<number> = correction ? correctedValues(raw, correction) : raw;
  const n = values.length;
  const si = new Float64Array(n);
  for (let i = 0; i < n; i++) si[i] = factor * values[i] + offset + offsetSi;
  // Without an offset (°C, gauge) the gain basis is the SI series itself; sharing it saves 8 MB per 10⁶ readings.
  let gainBasis = si;
  if (offset !== 0 || offsetSi !== 0) {
    gainBasis = new Float64Array(n);
    for (let i = 0; i < n; i++) gainBasis[i] = factor * values[i];
  }
  const name = instrument ? (instrument.name ? `${instrument.id} ${instrument.name}` : instrument.id) : undefined;
  return {
    key,
    label: name ? `${key} (${name})` : key,
    group: instrument?.id ?? key,
    instrument,
    raw,
    values,
    correction: correction?.applied ?? null,
    unit,
    si,
    gainBasis,
    factor,
    comps: instrument ? components(instrument) : NO_UNCERTAINTY,
  };
}

/**
 * The barometric pressure in Pa with its standard uncertainty: the typed u, combined with the components of the
 * barometer's specification when an instrument of the register is named (GUM 5.1.2, one reading: its gain
 * times the reading, full-scale and calibration offsets and the per-reading part, root-sum-square).
 */
function barometric(doc: RunDocument): (Scalar & { correction?: AppliedCorrection }) | undefined {
  const q = doc.ambient?.pressure;
  if (!q) return undefined;
  const base = scalar(q, 'pressure')!;
  const inst = instrumentOf(doc, q.instrument);
  if (!inst) return base;
  // The barometer's reading corrected by its certificate in force, as every other reading (GUM 3.2.3).
  const correction = correctionFor(inst, 'ambientPressure', 'pressure', q.unit, doc.runDate);
  const reading = correction ? q.value * correction.gain + correction.offset : q.value;
  const k = components(inst);
  const factor = differenceToSi('pressure', q.unit, 1);
  const inUnit = Math.hypot(q.u ?? 0, k.gain * reading, k.fullScaleOffset, k.calibrationOffset, k.random);
  const name = inst.name ? `${inst.id} ${inst.name}` : inst.id;
  return {
    value: toSi('pressure', q.unit, reading), u: factor * inUnit, label: `barometric pressure (${name})`, group: inst.id,
    ...(correction ? { correction: correction.applied } : {}),
  };
}

export function buildSeries(doc: RunDocument): RunSeries {
  const r = doc.readings;
  const N = r.time.values.length;
  let t: Float64Array;
  if (r.time.unit === 'iso') t = Float64Array.from(isoToSeconds(r.time.values as string[]));
  else {
    const f = affineToSi('time', r.time.unit).factor;
    const tv = r.time.values as number[];
    t = new Float64Array(N);
    for (let i = 0; i < N; i++) t[i] = f * tv[i];
  }
  const ambientPressure = barometric(doc);
  const gauge = r.pressure?.reference === 'gauge';
  if (gauge && !ambientPressure) throw new Error('gauge pressure needs ambient.pressure (barometric) to become absolute');
  const P = r.pressure ? channel(doc, 'pressure', 'pressure', r.pressure.values, r.pressure.unit, r.pressure.instrument, gauge ? ambientPressure!.value : 0) : undefined;
  const app = doc.apparatus ?? {};
  let V: ChannelSeries | undefined;
  let boreGain: number | undefined;
  let volumeOffsetU = 0;
  const dead = scalar(app.deadVolume, 'volume');
  if (r.volume) {
    V = channel(doc, 'volume', 'volume', r.volume.values, r.volume.unit, r.volume.instrument);
  } else if (r.displacement) {
    const bore = scalar(app.pistonBore, 'length')!;
    const area = pistonArea(bore.value);
    // Volume from displacement: a channel whose SI factor carries the piston area.
    const lengthFactor = affineToSi('length', r.displacement.unit).factor;
    V = channel(doc, 'volume', 'length', r.displacement.values, r.displacement.unit, r.displacement.instrument, dead?.value ?? 0, 'displacement');
    if (V.gainBasis === V.si) V.gainBasis = new Float64Array(N);
    for (let i = 0; i < N; i++) {
      V.gainBasis[i] = area * lengthFactor * V.values[i];
      V.si[i] = V.gainBasis[i] + (dead?.value ?? 0);
    }
    V.factor = area * lengthFactor;
    V.label = V.label.replace(/^volume/, 'displacement');
    boreGain = (2 * bore.u) / bore.value; // A = πd²/4 ⇒ u(A)/A = 2·u(d)/d (GUM 5.1.6)
    volumeOffsetU = dead?.u ?? 0;
  } else if (app.vesselVolume) {
    const vessel = scalar(app.vesselVolume, 'volume')!;
    V = channel(doc, 'volume', 'volume', new Array<number>(N).fill(app.vesselVolume.value), app.vesselVolume.unit, undefined);
    V.gainBasis = new Float64Array(N); // a fixed vessel has no reading to scale: its uncertainty is one common offset
    V.label = 'vessel volume';
    volumeOffsetU = vessel.u;
  }
  const T = channel(doc, 'temperature', 'temperature', r.temperature.values, r.temperature.unit, r.temperature.instrument);
  const U = r.voltage ? channel(doc, 'voltage', 'voltage', r.voltage.values, r.voltage.unit, r.voltage.instrument) : undefined;
  const I = r.current ? channel(doc, 'current', 'current', r.current.values, r.current.unit, r.current.instrument) : undefined;
  const Pw = r.power ? channel(doc, 'power', 'power', r.power.values, r.power.unit, r.power.instrument) : undefined;

  let amount: RunSeries['amount'] = { kind: 'none' };
  if (doc.gas.model !== 'calorimeter') {
    const a = doc.amount ?? { from: 'initialState' as const };
    if (a.from === 'moles') amount = { kind: 'moles', n: { value: a.value, u: a.u ?? 0 } };
    else if (a.from === 'mass') {
      const species = doc.gas.model === 'species' ? doc.gas.species : undefined;
      const Mg = a.molarMass ?? { value: species ? MOLAR_MASS_G[species] : NaN, u: 0 };
      amount = { kind: 'mass', m: scalar(a.mass, 'mass')!, M: { value: Mg.value * 1e-3, u: (Mg.u ?? 0) * 1e-3 } };
    } else amount = { kind: 'initialState', Z: { value: a.Z ?? 1, u: a.uZ ?? 0 } };
  }

  const { correction: baroCorrection, ...ambientPressureScalar } = ambientPressure ?? {};
  const corrections = [P, V, T, U, I, Pw].flatMap((c) => (c?.correction ? [c.correction] : []));
  if (baroCorrection) corrections.push(baroCorrection);
  return {
    N,
    t,
    P,
    V,
    T,
    U,
    I,
    Pw,
    gauge,
    ambientPressure: ambientPressure ? (ambientPressureScalar as Scalar) : undefined,
    ambientTemperature: scalar(doc.ambient?.temperature, 'temperature'),
    heatLoss: scalar(app.heatLossCoefficient, 'conductance'),
    wallUptake: scalar(app.wallUptake, 'energy'),
    heatCapacity: scalar(app.heatCapacity, 'heatCapacity'),
    boreGain,
    volumeOffsetU,
    amount,
    corrections,
  };
}
