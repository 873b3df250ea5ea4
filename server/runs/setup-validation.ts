import { SPECIES } from '../engine/gases';
import { validateCorrection } from '../engine/run-document-corrections';
import { isIsoDate, isUnit, toSi, type UnitKind } from '../engine/units';
import { badRequest, type FieldError } from '../core/problem';
import { isRecordId } from '../core/route-params';
import { TEXT_LIMITS } from '../../contract/text-limits';
import { CHANNELS, MAX_DECIMALS, channelNames, isDecimals } from './run-setup';


const APPARATUS_KINDS: Readonly<Record<string, UnitKind>> = {
  heatCapacity: 'heatCapacity', heatLossCoefficient: 'conductance', wallUptake: 'energy', ratedPressure: 'pressure',
  pistonBore: 'length', deadVolume: 'volume', vesselVolume: 'volume',
};
const INSTRUMENT_NUMBERS = ['percentOfReading', 'percentOfFullScale', 'fullScale', 'resolution', 'repeatability'];
const TIME_UNITS = ['ms', 's', 'min', 'h', 'iso'];

const isObject = (v: unknown): v is Record<string, unknown> => typeof v === 'object' && v !== null && !Array.isArray(v);

/** Collects what is wrong with a setup, field by field (runs.setup: see run-setup.ts). */
class SetupCheck {
  readonly errors: FieldError[] = [];
  add(field: string, message: string) {
    this.errors.push({ field, message: `${field} ${message}` });
  }
  object(v: unknown, field: string, keys: readonly string[]): v is Record<string, unknown> {
    if (!isObject(v)) {
      this.add(field, `must be an object with ${keys.join(', ')}`);
      return false;
    }
    for (const key of Object.keys(v)) if (!keys.includes(key)) this.add(`${field}.${key}`, `is not part of ${field}; it holds ${keys.join(', ')}`);
    return true;
  }
  number(v: unknown, field: string, opts: { min?: number; required?: boolean } = {}) {
    if (v === undefined) {
      if (opts.required) this.add(field, 'is required');
      return;
    }
    if (typeof v !== 'number' || !Number.isFinite(v)) return this.add(field, `must be a finite number, got ${JSON.stringify(v)}`);
    if (opts.min !== undefined && v < opts.min) this.add(field, `must be at least ${opts.min}, got ${v}`);
  }
  text(v: unknown, field: string, max: number = TEXT_LIMITS.name) {
    if (v !== undefined && (typeof v !== 'string' || v.length > max)) this.add(field, `must be text of at most ${max} characters`);
  }
  quantity(v: unknown, field: string, kind: UnitKind, extra: readonly string[] = []) {
    if (!this.object(v, field, ['value', 'unit', 'u', ...extra])) return;
    this.number(v['value'], `${field}.value`, { required: true });
    this.number(v['u'], `${field}.u`, { min: 0 });
    if (!isUnit(kind, v['unit'])) return this.add(`${field}.unit`, `must be a ${kind} unit, got ${JSON.stringify(v['unit'])}`);
    if (typeof v['value'] === 'number' && !Number.isFinite(toSi(kind, v['unit'] as string, v['value']))) {
      this.add(`${field}.value`, `is beyond any measurable ${kind} once converted to SI units`);
    }
  }
}

function checkGas(c: SetupCheck, gas: unknown) {
  if (!c.object(gas, 'setup.gas', ['model', 'species', 'realGas', 'f'])) return;
  if (gas['realGas'] !== undefined && typeof gas['realGas'] !== 'boolean') c.add('setup.gas.realGas', 'must be true or false');
  if (gas['model'] === 'species') {
    if (!SPECIES.includes(gas['species'] as (typeof SPECIES)[number])) c.add('setup.gas.species', `must be one of ${SPECIES.join(', ')}`);
  } else if (gas['model'] === 'equipartition') c.number(gas['f'], 'setup.gas.f', { required: true, min: 0 });
  else if (gas['model'] !== 'calorimeter') c.add('setup.gas.model', 'must be "species", "equipartition" or "calorimeter"');
}

function checkAmount(c: SetupCheck, amount: unknown) {
  if (!c.object(amount, 'setup.amount', ['from', 'value', 'u', 'mass', 'molarMass', 'Z', 'uZ'])) return;
  if (amount['from'] === 'moles') {
    c.number(amount['value'], 'setup.amount.value', { required: true, min: 0 });
    c.number(amount['u'], 'setup.amount.u', { min: 0 });
  } else if (amount['from'] === 'mass') {
    c.quantity(amount['mass'], 'setup.amount.mass', 'mass');
    if (amount['molarMass'] !== undefined && c.object(amount['molarMass'], 'setup.amount.molarMass', ['value', 'u'])) {
      c.number((amount['molarMass'] as Record<string, unknown>)['value'], 'setup.amount.molarMass.value', { required: true, min: 0 });
    }
  } else if (amount['from'] === 'initialState') {
    c.number(amount['Z'], 'setup.amount.Z', { min: 0 });
    c.number(amount['uZ'], 'setup.amount.uZ', { min: 0 });
  } else c.add('setup.amount.from', 'must be "moles", "mass" or "initialState"');
}

function checkInstruments(c: SetupCheck, list: unknown) {
  if (!Array.isArray(list)) return c.add('setup.instruments', 'must be a list of instruments described in the run');
  if (list.length > 100) return c.add('setup.instruments', 'holds at most 100 instruments');
  list.forEach((inst, i) => {
    const f = `setup.instruments[${i}]`;
    if (!c.object(inst, f, ['id', 'name', 'range', 'calibrationDate', 'dueDate', 'calibration', ...INSTRUMENT_NUMBERS])) return;
    if (typeof inst['id'] !== 'string' || inst['id'] === '' || inst['id'].length > TEXT_LIMITS.instrumentId) c.add(`${f}.id`, `must be a non-empty text of at most ${TEXT_LIMITS.instrumentId} characters`);
    c.text(inst['name'], `${f}.name`);
    for (const key of INSTRUMENT_NUMBERS) c.number(inst[key], `${f}.${key}`, { min: 0 });
    if (inst['range'] !== undefined && c.object(inst['range'], `${f}.range`, ['min', 'max'])) {
      const r = inst['range'] as Record<string, unknown>;
      c.number(r['min'], `${f}.range.min`, { required: true });
      c.number(r['max'], `${f}.range.max`, { required: true });
    }
    if (inst['calibration'] !== undefined && c.object(inst['calibration'], `${f}.calibration`, ['U', 'k', 'correction'])) {
      const cal = inst['calibration'] as Record<string, unknown>;
      c.number(cal['U'], `${f}.calibration.U`, { required: true, min: 0 });
      c.number(cal['k'], `${f}.calibration.k`, { required: true, min: 0 });
      if (cal['correction'] !== undefined) validateCorrection(cal['correction'], `${f}.calibration.correction`, (field, message) => c.add(field, message));
    }
    for (const key of ['calibrationDate', 'dueDate']) if (inst[key] !== undefined && !isIsoDate(inst[key])) c.add(`${f}.${key}`, 'must be a date like 2026-03-14');
  });
}

function checkChannels(c: SetupCheck, channels: unknown) {
  if (!c.object(channels, 'setup.channels', channelNames)) return;
  for (const [name, channel] of Object.entries(channels)) {
    if (!(channelNames as string[]).includes(name)) continue;
    const f = `setup.channels.${name}`;
    if (!c.object(channel, f, ['unit', 'instrumentId', 'instrument', 'reference', 'decimals'])) continue;
    if (!isUnit(CHANNELS[name as keyof typeof CHANNELS], channel['unit'])) c.add(`${f}.unit`, `must be a ${CHANNELS[name as keyof typeof CHANNELS]} unit, got ${JSON.stringify(channel['unit'])}`);
    const id = channel['instrumentId'];
    if (id !== undefined && !isRecordId(id)) c.add(`${f}.instrumentId`, 'must be the id of an instrument of the register (a whole number from 1)');
    c.text(channel['instrument'], `${f}.instrument`, TEXT_LIMITS.instrumentId);
    if (channel['reference'] !== undefined && channel['reference'] !== 'absolute' && channel['reference'] !== 'gauge') c.add(`${f}.reference`, 'must be "absolute" or "gauge"');
    const decimals = channel['decimals'];
    if (decimals !== undefined && !isDecimals(decimals)) c.add(`${f}.decimals`, `must be the number of decimals the readings were entered with, a whole number from 0 to ${MAX_DECIMALS}, got ${JSON.stringify(decimals)}`);
  }
}

/** The calorimetric fields of a run document kept in the setup: purpose, the known heat of a standardization, the main period. */
function checkCalorimetry(c: SetupCheck, setup: Record<string, unknown>) {
  if (setup['purpose'] !== undefined && setup['purpose'] !== 'measurement' && setup['purpose'] !== 'standardization') c.add('setup.purpose', 'must be "measurement" or "standardization"');
  const source = setup['heatSource'];
  if (source !== undefined && c.object(source, 'setup.heatSource', ['kind', 'material', 'mass', 'massicEnergy', 'corrections'])) {
    if (source['kind'] === 'reference-material') {
      c.text(source['material'], 'setup.heatSource.material');
      c.quantity(source['mass'], 'setup.heatSource.mass', 'mass');
      if (c.object(source['massicEnergy'], 'setup.heatSource.massicEnergy', ['value', 'unit', 'u'])) {
        const e = source['massicEnergy'] as Record<string, unknown>;
        c.number(e['value'], 'setup.heatSource.massicEnergy.value', { required: true });
        c.number(e['u'], 'setup.heatSource.massicEnergy.u', { min: 0 });
        c.text(e['unit'], 'setup.heatSource.massicEnergy.unit', 10);
      }
      const corrections = source['corrections'];
      if (corrections !== undefined && !Array.isArray(corrections)) c.add('setup.heatSource.corrections', 'must be a list of { name, energy }');
      else (corrections as unknown[] | undefined)?.slice(0, 100).forEach((corr, i) => {
        const f = `setup.heatSource.corrections[${i}]`;
        if (!c.object(corr, f, ['name', 'energy'])) return;
        c.text((corr as Record<string, unknown>)['name'], `${f}.name`);
        c.quantity((corr as Record<string, unknown>)['energy'], `${f}.energy`, 'energy');
      });
    } else if (source['kind'] !== 'electrical') c.add('setup.heatSource.kind', 'must be "electrical" or "reference-material"');
  }
  if (setup['periods'] !== undefined && c.object(setup['periods'], 'setup.periods', ['mainStart', 'mainEnd'])) {
    const p = setup['periods'] as Record<string, unknown>;
    c.number(p['mainStart'], 'setup.periods.mainStart', { required: true });
    c.number(p['mainEnd'], 'setup.periods.mainEnd', { required: true });
  }
}

/**
 * Checks a run's setup as strictly as a body: known keys only, each of its own shape, numbers finite
 * (also once converted to SI), ids that fit the register's id column. `setup: {"instruments": 5}`
 * is refused here, so it can never be stored and break every later read of the run.
 */
export function setupProblems(setup: unknown): FieldError[] {
  const c = new SetupCheck();
  const keys = ['gas', 'amount', 'processIndex', 'ambient', 'apparatus', 'apparatusSource', 'instruments', 'time', 'channels', 'notes', 'purpose', 'heatSource', 'periods'];
  if (!c.object(setup, 'setup', keys)) return c.errors;
  if (setup['gas'] !== undefined) checkGas(c, setup['gas']);
  if (setup['amount'] !== undefined) checkAmount(c, setup['amount']);
  c.number(setup['processIndex'], 'setup.processIndex');
  if (setup['ambient'] !== undefined && c.object(setup['ambient'], 'setup.ambient', ['pressure', 'temperature'])) {
    const ambient = setup['ambient'] as Record<string, unknown>;
    if (ambient['pressure'] !== undefined) {
      // The barometer may be an instrument described in the run (setup.instruments[].id).
      c.quantity(ambient['pressure'], 'setup.ambient.pressure', 'pressure', ['instrument']);
      c.text((ambient['pressure'] as Record<string, unknown>)?.['instrument'], 'setup.ambient.pressure.instrument', TEXT_LIMITS.instrumentId);
    }
    if (ambient['temperature'] !== undefined) c.quantity(ambient['temperature'], 'setup.ambient.temperature', 'temperature');
  }
  if (setup['apparatus'] !== undefined && c.object(setup['apparatus'], 'setup.apparatus', ['name', ...Object.keys(APPARATUS_KINDS)])) {
    const app = setup['apparatus'] as Record<string, unknown>;
    c.text(app['name'], 'setup.apparatus.name');
    for (const [key, kind] of Object.entries(APPARATUS_KINDS)) if (app[key] !== undefined) c.quantity(app[key], `setup.apparatus.${key}`, kind, key === 'ratedPressure' ? ['reference'] : []);
    const reference = isObject(app['ratedPressure']) ? app['ratedPressure']['reference'] : undefined;
    if (reference !== undefined && reference !== 'absolute' && reference !== 'gauge') c.add('setup.apparatus.ratedPressure.reference', 'must be "absolute" or "gauge"');
  }
  if (setup['apparatusSource'] !== undefined && setup['apparatusSource'] !== 'register' && setup['apparatusSource'] !== 'run') c.add('setup.apparatusSource', 'must be "register" or "run"');
  if (setup['instruments'] !== undefined) checkInstruments(c, setup['instruments']);
  if (setup['time'] !== undefined && c.object(setup['time'], 'setup.time', ['unit', 'origin'])) {
    const time = setup['time'] as Record<string, unknown>;
    if (!TIME_UNITS.includes(time['unit'] as string)) c.add('setup.time.unit', `must be one of ${TIME_UNITS.join(', ')}`);
    c.text(time['origin'], 'setup.time.origin', 40);
  }
  if (setup['channels'] !== undefined) checkChannels(c, setup['channels']);
  c.text(setup['notes'], 'setup.notes', TEXT_LIMITS.runNotes);
  checkCalorimetry(c, setup);
  return c.errors;
}

/** Throws a 400 listing the setup's problems; nothing is stored. */
export function assertValidSetup(setup: unknown): void {
  const errors = setupProblems(setup);
  if (errors.length) throw badRequest(`The run's setup has ${errors.length} problem(s): ${errors.slice(0, 3).map((e) => e.message).join('; ')}. Nothing was changed.`, errors);
}
