// The run document: Qwell's versioned JSON interchange format for one run (docs/run-document.md),
// and its validation into a list of { path, message } problems.
import type { RunTimeUnit } from '../../contract/api/runs';
import { CHANNEL_UNIT_KINDS } from '../../contract/channels';
import { RUN_PROCESSES } from '../../contract/runs';
import { TEXT_LIMITS, tooLong } from '../../contract/text-limits';
import { SPECIES, type Species } from './gases';
import type { InstrumentSpec } from './instrument-uncertainty';
import { validateCalorimetryFields, type CalorimetryFields } from './run-document-calorimetry';
import { validateCorrection, validateCorrectionUnits } from './run-document-corrections';
import { isIsoDate, isUnit, unitsOf, type UnitKind } from './units';
import type { ClaimedProcess } from './work';

export const RUN_FORMAT = 'qwell.run';
export const RUN_FORMAT_VERSION = 1;

/** A single quantity as entered: value, unit and optional standard uncertainty u in the same unit. */
export interface Quantity {
  value: number;
  unit: string;
  u?: number;
}

export type GasSpec =
  /** realGas: add the second-virial departure to ΔU (default true). */
  | { model: 'species'; species: Species; realGas?: boolean }
  | { model: 'equipartition'; f: number }
  | { model: 'calorimeter' };

export type AmountSpec =
  | { from: 'moles'; value: number; u?: number }
  /** Molar mass in g/mol; defaults to the species' standard value. */
  | { from: 'mass'; mass: Quantity; molarMass?: { value: number; u?: number } }
  | { from: 'initialState'; Z?: number; uZ?: number };

export interface Instrument extends InstrumentSpec {
  id: string;
  name?: string;
  /** Working range in the unit of the channel it reads. */
  range?: { min: number; max: number };
  calibrationDate?: string;
  dueDate?: string;
}

export interface Channel {
  unit: string;
  /** Id of an entry of `instruments`. */
  instrument?: string;
  values: number[];
}

export interface PressureChannel extends Channel {
  reference: 'absolute' | 'gauge';
}

export interface Readings {
  /** Milliseconds, seconds, minutes, hours, or ISO 8601 timestamps (unit "iso"). */
  time: { unit: RunTimeUnit; values: Array<number | string> };
  pressure?: PressureChannel;
  volume?: Channel;
  /** Piston displacement (m or mm); V = deadVolume + π·bore²/4 · x. */
  displacement?: Channel;
  temperature: Channel;
  voltage?: Channel;
  current?: Channel;
  /** Heater power, when logged directly instead of voltage and current. */
  power?: Channel;
}

export interface Apparatus {
  name?: string;
  heatCapacity?: Quantity;
  heatLossCoefficient?: Quantity;
  wallUptake?: Quantity;
  /** The vessel's rated pressure; a gauge rating is read above the run's barometric pressure (default absolute). */
  ratedPressure?: Quantity & { reference?: 'absolute' | 'gauge' };
  pistonBore?: Quantity;
  deadVolume?: Quantity;
  vesselVolume?: Quantity;
}

export interface RunDocument extends CalorimetryFields {
  format: typeof RUN_FORMAT;
  version: typeof RUN_FORMAT_VERSION;
  id?: string;
  title?: string;
  lab?: string;
  operator?: string;
  /** ISO 8601 date of the run; instruments' calibration status is judged on it. */
  runDate: string;
  process: { claimed: ClaimedProcess; index?: number };
  gas: GasSpec;
  amount?: AmountSpec;
  /** The barometer may be an instrument of `instruments`: its specification then adds to the typed u. */
  ambient: { pressure?: Quantity & { instrument?: string }; temperature?: Quantity };
  apparatus: Apparatus;
  instruments: Instrument[];
  readings: Readings;
}

export interface ValidationError {
  path: string;
  message: string;
}

export type ValidationResult = { ok: true; doc: RunDocument } | { ok: false; errors: ValidationError[] };

export const PROCESSES: readonly ClaimedProcess[] = RUN_PROCESSES;

/** The reading channels besides time, and the unit kind of each. */
export const CHANNEL_KINDS: Readonly<Record<Exclude<keyof Readings, 'time'>, UnitKind>> = CHANNEL_UNIT_KINDS;

const APPARATUS_KINDS: Readonly<Record<Exclude<keyof Apparatus, 'name'>, UnitKind>> = {
  heatCapacity: 'heatCapacity',
  heatLossCoefficient: 'conductance',
  wallUptake: 'energy',
  ratedPressure: 'pressure',
  pistonBore: 'length',
  deadVolume: 'volume',
  vesselVolume: 'volume',
};

/** Lists at most this many bad values per channel, then one summary line. */
const MAX_VALUE_ERRORS = 20;

const isObject = (v: unknown): v is Record<string, unknown> => typeof v === 'object' && v !== null && !Array.isArray(v);
const isFiniteNumber = (v: unknown): v is number => typeof v === 'number' && Number.isFinite(v);

class Collector {
  readonly errors: ValidationError[] = [];
  add(path: string, message: string): void {
    this.errors.push({ path, message });
  }
  number(obj: Record<string, unknown>, key: string, path: string, opts: { required?: boolean; min?: number; positive?: boolean } = {}): void {
    const v = obj[key];
    if (v === undefined) {
      if (opts.required) this.add(`${path}.${key}`, 'is required');
      return;
    }
    if (!isFiniteNumber(v)) return this.add(`${path}.${key}`, `must be a finite number, got ${JSON.stringify(v)}`);
    if (opts.positive && !(v > 0)) return this.add(`${path}.${key}`, `must be greater than 0, got ${v}`);
    if (opts.min !== undefined && v < opts.min) this.add(`${path}.${key}`, `must be at least ${opts.min}, got ${v}`);
  }
  quantity(v: unknown, path: string, kind: UnitKind, opts: { positive?: boolean } = {}): void {
    if (!isObject(v)) return this.add(path, 'must be an object { value, unit, u? }');
    this.number(v, 'value', path, { required: true, positive: opts.positive });
    this.unit(v['unit'], `${path}.unit`, kind);
    this.number(v, 'u', path, { min: 0 });
  }
  /** Optional free text: a string of at most `max` characters. */
  text(v: unknown, path: string, max: number): void {
    if (v === undefined) return;
    if (typeof v !== 'string') this.add(path, 'must be a string');
    else if (v.length > max) this.add(path, tooLong(max, v.length));
  }
  unit(v: unknown, path: string, kind: UnitKind, extra: string[] = []): void {
    if (!isUnit(kind, v) && !extra.includes(v as string)) {
      this.add(path, `unknown ${kind} unit ${JSON.stringify(v)}; use one of ${[...unitsOf(kind), ...extra].join(', ')}`);
    }
  }
}

/** The document's own free text: its id is a code, the rest are a title's and a name's length. */
const DOCUMENT_TEXT: Array<[string, number]> = [['id', TEXT_LIMITS.code], ['title', TEXT_LIMITS.title], ['lab', TEXT_LIMITS.name], ['operator', TEXT_LIMITS.name]];

export function validateRunDocument(input: unknown): ValidationResult {
  const c = new Collector();
  if (!isObject(input)) return { ok: false, errors: [{ path: '', message: 'a run document must be a JSON object' }] };
  if (input['format'] !== RUN_FORMAT) c.add('format', `must be "${RUN_FORMAT}", got ${JSON.stringify(input['format'])}`);
  if (input['version'] !== RUN_FORMAT_VERSION) c.add('version', `must be ${RUN_FORMAT_VERSION} (the only version this engine reads), got ${JSON.stringify(input['version'])}`);
  for (const [key, max] of DOCUMENT_TEXT) c.text(input[key], key, max);
  if (!isIsoDate(input['runDate'])) c.add('runDate', `must be an ISO 8601 date such as "2026-03-14", got ${JSON.stringify(input['runDate'])}`);

  const process = input['process'];
  let claimed: string | undefined;
  if (!isObject(process)) c.add('process', 'is required: { claimed, index? }');
  else {
    claimed = process['claimed'] as string;
    if (!PROCESSES.includes(claimed as ClaimedProcess)) c.add('process.claimed', `must be one of ${PROCESSES.join(', ')}, got ${JSON.stringify(claimed)}`);
    if (claimed === 'polytropic') c.number(process, 'index', 'process', { required: true });
    else if (process['index'] !== undefined) c.add('process.index', 'is only read for a polytropic run');
  }

  const gas = input['gas'];
  let gasModel: string | undefined;
  let species: string | undefined;
  if (!isObject(gas)) c.add('gas', 'is required: { model: "species", species } | { model: "equipartition", f } | { model: "calorimeter" }');
  else {
    gasModel = gas['model'] as string;
    if (gasModel === 'species') {
      species = gas['species'] as string;
      if (!SPECIES.includes(species as Species)) c.add('gas.species', `must be one of ${SPECIES.join(', ')}, got ${JSON.stringify(species)}`);
      if (gas['realGas'] !== undefined && typeof gas['realGas'] !== 'boolean') c.add('gas.realGas', `must be true or false, got ${JSON.stringify(gas['realGas'])}`);
    } else if (gasModel === 'equipartition') c.number(gas, 'f', 'gas', { required: true, positive: true });
    else if (gasModel !== 'calorimeter') c.add('gas.model', `must be "species", "equipartition" or "calorimeter", got ${JSON.stringify(gasModel)}`);
  }

  const ambient = isObject(input['ambient']) ? input['ambient'] : undefined;
  if (input['ambient'] !== undefined && !ambient) c.add('ambient', 'must be an object { pressure?, temperature? }');
  if (ambient?.['pressure'] !== undefined) c.quantity(ambient['pressure'], 'ambient.pressure', 'pressure', { positive: true });
  if (ambient?.['temperature'] !== undefined) c.quantity(ambient['temperature'], 'ambient.temperature', 'temperature');

  const apparatus = isObject(input['apparatus']) ? input['apparatus'] : {};
  if (input['apparatus'] !== undefined && !isObject(input['apparatus'])) c.add('apparatus', 'must be an object');
  c.text(apparatus['name'], 'apparatus.name', TEXT_LIMITS.name);
  for (const [key, kind] of Object.entries(APPARATUS_KINDS)) {
    if (apparatus[key] !== undefined) c.quantity(apparatus[key], `apparatus.${key}`, kind, { positive: key === 'pistonBore' || key === 'vesselVolume' || key === 'heatCapacity' });
  }
  const ratedReference = isObject(apparatus['ratedPressure']) ? apparatus['ratedPressure']['reference'] : undefined;
  if (ratedReference !== undefined && ratedReference !== 'absolute' && ratedReference !== 'gauge') {
    c.add('apparatus.ratedPressure.reference', `must be "absolute" or "gauge", got ${JSON.stringify(ratedReference)}`);
  }

  const instrumentIds = validateInstruments(input['instruments'], c);
  const baro = ambient?.['pressure'];
  if (isObject(baro) && baro['instrument'] !== undefined && (typeof baro['instrument'] !== 'string' || !instrumentIds.has(baro['instrument']))) {
    c.add('ambient.pressure.instrument', `names no entry of instruments: ${JSON.stringify(baro['instrument'])}`);
  }
  const channels = validateReadings(input['readings'], c, instrumentIds);
  validateCorrectionUnits(input, (p, m) => c.add(p, m));

  validateCalorimetryFields(input, (p, m) => c.add(p, m), { channels, timeUnit: isObject(input['readings']) ? (input['readings'] as Record<string, unknown>)['time'] : undefined });
  // Cross-field rules: each says which fields disagree and what would fix it.
  if (channels) {
    const has = (k: string) => channels.has(k);
    if (has('volume') && has('displacement')) c.add('readings.displacement', 'give volume or displacement, not both');
    if (has('displacement') && apparatus['pistonBore'] === undefined) c.add('apparatus.pistonBore', 'is required when volume comes from piston displacement');
    const volumeSource = has('volume') || has('displacement') || apparatus['vesselVolume'] !== undefined;
    if ((has('volume') || has('displacement')) && !has('pressure')) c.add('readings.pressure', 'is required when volume changes: W = ∫P dV needs both');
    if (claimed && ['isobaric', 'isothermal', 'adiabatic', 'polytropic'].includes(claimed) && !(has('volume') || has('displacement'))) {
      c.add('readings.volume', `is required for a ${claimed} run (volume or displacement readings)`);
    }
    const pressure = isObject(input['readings']) && isObject((input['readings'] as Record<string, unknown>)['pressure'])
      ? ((input['readings'] as Record<string, unknown>)['pressure'] as Record<string, unknown>) : undefined;
    if (pressure?.['reference'] === 'gauge' && ambient?.['pressure'] === undefined) {
      c.add('ambient.pressure', 'is required because readings.pressure.reference is "gauge": a gauge reading needs the barometric pressure to become absolute');
    }
    if (ratedReference === 'gauge' && has('pressure') && ambient?.['pressure'] === undefined) {
      c.add('ambient.pressure', 'is required because the apparatus\'s rated pressure is a gauge rating: the readings are compared with it above the barometric pressure');
    }
    if (has('voltage') !== has('current')) c.add(has('voltage') ? 'readings.current' : 'readings.voltage', 'heater voltage and current must be given together (Q = ∫U·I dt)');
    if (has('power') && (has('voltage') || has('current'))) c.add('readings.power', 'give heater power or voltage and current, not both');
    if (apparatus['heatLossCoefficient'] !== undefined && ambient?.['temperature'] === undefined) {
      c.add('ambient.temperature', 'is required when apparatus.heatLossCoefficient is given (heat leak ∫h·(T − T_ambient) dt)');
    }
    if (gasModel === 'calorimeter' && apparatus['heatCapacity'] === undefined) c.add('apparatus.heatCapacity', 'is required for gas.model "calorimeter" (ΔU = C·ΔT)');
    if (gasModel && gasModel !== 'calorimeter' && apparatus['heatCapacity'] !== undefined && apparatus['wallUptake'] !== undefined) {
      c.add('apparatus.wallUptake', 'give the vessel wall heat capacity apparatus.heatCapacity (wall uptake C·ΔT from the readings) or a fixed apparatus.wallUptake, not both: together they count the wall twice');
    }
    if (gasModel && gasModel !== 'calorimeter') validateAmount(input['amount'], c, { species, pressure: has('pressure'), volume: volumeSource });
    else if (input['amount'] !== undefined) c.add('amount', 'is not read for a calorimeter run');
  }
  if (c.errors.length > 0) return { ok: false, errors: c.errors };
  return { ok: true, doc: input as unknown as RunDocument };
}

function validateAmount(amount: unknown, c: Collector, ctx: { species?: string; pressure: boolean; volume: boolean }): void {
  const fromState = () => {
    if (!ctx.pressure || !ctx.volume) c.add('amount', 'is required: without pressure and volume readings n cannot come from the initial state');
  };
  if (amount === undefined) return fromState();
  if (!isObject(amount)) return c.add('amount', 'must be an object { from: "moles" | "mass" | "initialState", ... }');
  switch (amount['from']) {
    case 'moles':
      c.number(amount, 'value', 'amount', { required: true, positive: true });
      c.number(amount, 'u', 'amount', { min: 0 });
      return;
    case 'mass':
      c.quantity(amount['mass'], 'amount.mass', 'mass', { positive: true });
      if (amount['molarMass'] === undefined) {
        if (!ctx.species) c.add('amount.molarMass', 'is required (g/mol) unless gas.species gives it');
      } else if (!isObject(amount['molarMass'])) c.add('amount.molarMass', 'must be an object { value (g/mol), u? }');
      else {
        c.number(amount['molarMass'], 'value', 'amount.molarMass', { required: true, positive: true });
        c.number(amount['molarMass'], 'u', 'amount.molarMass', { min: 0 });
      }
      return;
    case 'initialState':
      c.number(amount, 'Z', 'amount', { positive: true });
      c.number(amount, 'uZ', 'amount', { min: 0 });
      return fromState();
    default:
      c.add('amount.from', `must be "moles", "mass" or "initialState", got ${JSON.stringify(amount['from'])}`);
  }
}

function validateInstruments(list: unknown, c: Collector): Set<string> {
  const ids = new Set<string>();
  if (list === undefined) return ids;
  if (!Array.isArray(list)) {
    c.add('instruments', 'must be an array');
    return ids;
  }
  list.forEach((inst, i) => {
    const p = `instruments[${i}]`;
    if (!isObject(inst)) return c.add(p, 'must be an object');
    if (typeof inst['id'] !== 'string' || inst['id'] === '') c.add(`${p}.id`, 'is required (a non-empty string)');
    else if (inst['id'].length > TEXT_LIMITS.instrumentId) c.add(`${p}.id`, tooLong(TEXT_LIMITS.instrumentId, inst['id'].length));
    else if (ids.has(inst['id'])) c.add(`${p}.id`, `duplicates the id "${inst['id']}"`);
    else ids.add(inst['id']);
    c.text(inst['name'], `${p}.name`, TEXT_LIMITS.name);
    for (const key of ['percentOfReading', 'percentOfFullScale', 'fullScale', 'resolution', 'repeatability']) c.number(inst, key, p, { min: 0 });
    if (inst['percentOfFullScale'] !== undefined && inst['fullScale'] === undefined) c.add(`${p}.fullScale`, 'is required with percentOfFullScale');
    const cal = inst['calibration'];
    if (cal !== undefined) {
      if (!isObject(cal)) c.add(`${p}.calibration`, 'must be an object { U, k, correction? }');
      else {
        c.number(cal, 'U', `${p}.calibration`, { required: true, min: 0 });
        c.number(cal, 'k', `${p}.calibration`, { required: true, positive: true });
        if (cal['correction'] !== undefined) validateCorrection(cal['correction'], `${p}.calibration.correction`, (path, m) => c.add(path, m));
      }
    }
    const range = inst['range'];
    if (range !== undefined) {
      if (!isObject(range) || !isFiniteNumber(range['min']) || !isFiniteNumber(range['max']) || range['min'] >= range['max']) {
        c.add(`${p}.range`, 'must be { min, max } with min < max, in the unit of the channel it reads');
      }
    }
    for (const key of ['calibrationDate', 'dueDate']) {
      if (inst[key] !== undefined && !isIsoDate(inst[key])) c.add(`${p}.${key}`, `must be an ISO 8601 date, got ${JSON.stringify(inst[key])}`);
    }
  });
  return ids;
}

function validateReadings(readings: unknown, c: Collector, instrumentIds: Set<string>): Set<string> | null {
  if (!isObject(readings)) {
    c.add('readings', 'is required: { time, temperature, pressure?, volume? | displacement?, voltage?, current?, power? }');
    return null;
  }
  const present = new Set<string>();
  const time = readings['time'];
  let length = -1;
  if (!isObject(time)) c.add('readings.time', 'is required: { unit, values }');
  else {
    const unit = time['unit'];
    c.unit(unit, 'readings.time.unit', 'time', ['iso']);
    const values = time['values'];
    if (!Array.isArray(values)) c.add('readings.time.values', 'must be an array');
    else {
      length = values.length;
      if (length < 2) c.add('readings.time.values', `needs at least 2 readings, got ${length}`);
      let bad = 0;
      values.forEach((v, i) => {
        const ok = unit === 'iso' ? isIsoDate(v) : isFiniteNumber(v);
        if (!ok && ++bad <= MAX_VALUE_ERRORS) c.add(`readings.time[${i}]`, unit === 'iso' ? `must be an ISO 8601 timestamp, got ${JSON.stringify(v)}` : `must be a finite number, got ${JSON.stringify(v)}`);
      });
      if (bad > MAX_VALUE_ERRORS) c.add('readings.time', `${bad - MAX_VALUE_ERRORS} more bad values not listed`);
    }
  }
  for (const key of Object.keys(readings)) {
    if (key !== 'time' && !(key in CHANNEL_KINDS)) c.add(`readings.${key}`, `is not a channel this format knows (${['time', ...Object.keys(CHANNEL_KINDS)].join(', ')})`);
  }
  for (const [key, kind] of Object.entries(CHANNEL_KINDS)) {
    const ch = readings[key];
    if (ch === undefined) {
      if (key === 'temperature') c.add('readings.temperature', 'is required');
      continue;
    }
    present.add(key);
    const p = `readings.${key}`;
    if (!isObject(ch)) {
      c.add(p, 'must be an object { unit, values, instrument? }');
      continue;
    }
    c.unit(ch['unit'], `${p}.unit`, kind);
    if (key === 'pressure' && ch['reference'] !== 'absolute' && ch['reference'] !== 'gauge') {
      c.add(`${p}.reference`, `must be "absolute" or "gauge", got ${JSON.stringify(ch['reference'])}`);
    }
    if (ch['instrument'] !== undefined && (typeof ch['instrument'] !== 'string' || !instrumentIds.has(ch['instrument']))) {
      c.add(`${p}.instrument`, `names no entry of instruments: ${JSON.stringify(ch['instrument'])}`);
    }
    const values = ch['values'];
    if (!Array.isArray(values)) {
      c.add(`${p}.values`, 'must be an array of numbers');
      continue;
    }
    if (length >= 0 && values.length !== length) c.add(`${p}.values`, `has ${values.length} readings but time has ${length}; every channel needs one value per time point`);
    let bad = 0;
    values.forEach((v, i) => {
      if (!isFiniteNumber(v) && ++bad <= MAX_VALUE_ERRORS) c.add(`${p}[${i}]`, `must be a finite number, got ${JSON.stringify(v)}`);
    });
    if (bad > MAX_VALUE_ERRORS) c.add(p, `${bad - MAX_VALUE_ERRORS} more bad values not listed`);
  }
  return present;
}
