// Validation of a run document's calorimetry fields: purpose, heatSource and periods (docs/run-document.md).
import { MASSIC_ENERGY_FACTORS, type HeatSource } from './energy-equivalent';
import { isUnit } from './units';
import { TEXT_LIMITS, tooLong } from '../../contract/text-limits';

export type RunPurpose = 'measurement' | 'standardization';
export const PURPOSES: readonly RunPurpose[] = ['measurement', 'standardization'];

export interface CalorimetryFields {
  /** Default "measurement". */
  purpose?: RunPurpose;
  /** Known heat input of a standardization run. */
  heatSource?: HeatSource;
  /** Main period in the time channel's unit (seconds from the first reading for ISO timestamps). */
  periods?: { mainStart: number; mainEnd: number };
}

const isObject = (v: unknown): v is Record<string, unknown> => typeof v === 'object' && v !== null && !Array.isArray(v);
const isFinite = (v: unknown): v is number => typeof v === 'number' && Number.isFinite(v);

type Add = (path: string, message: string) => void;

function quantity(v: unknown, path: string, add: Add, unitOk: (u: unknown) => boolean, units: string, positive: boolean): void {
  if (!isObject(v)) return add(path, `must be an object { value, unit, u? } with unit ${units}`);
  if (!isFinite(v['value'])) add(`${path}.value`, `must be a finite number, got ${JSON.stringify(v['value'])}`);
  else if (positive && !(v['value'] > 0)) add(`${path}.value`, `must be greater than 0, got ${v['value']}`);
  if (!unitOk(v['unit'])) add(`${path}.unit`, `must be one of ${units}, got ${JSON.stringify(v['unit'])}`);
  if (v['u'] !== undefined && !(isFinite(v['u']) && v['u'] >= 0)) add(`${path}.u`, 'must be a number of at least 0');
}

/** Adds a problem per bad field; `channels` are the reading channels present. */
export function validateCalorimetryFields(input: Record<string, unknown>, add: Add, ctx: { channels: Set<string> | null; timeUnit: unknown }): void {
  const purpose = input['purpose'];
  if (purpose !== undefined && !PURPOSES.includes(purpose as RunPurpose)) add('purpose', `must be "measurement" or "standardization", got ${JSON.stringify(purpose)}`);
  const src = input['heatSource'];
  if (purpose === 'standardization') {
    if (src === undefined) add('heatSource', 'is required for a standardization run: { "kind": "electrical" } or { "kind": "reference-material", ... }');
    const gas = input['gas'];
    if (isObject(gas) && gas['model'] !== 'calorimeter') add('gas.model', 'must be "calorimeter" for a standardization run');
  } else if (src !== undefined) add('heatSource', 'is only read for a standardization run (purpose "standardization")');
  if (src !== undefined && purpose === 'standardization') {
    if (!isObject(src)) add('heatSource', 'must be an object with kind "electrical" or "reference-material"');
    else if (src['kind'] === 'electrical') {
      const ch = ctx.channels;
      if (ch && !(ch.has('power') || (ch.has('voltage') && ch.has('current')))) {
        add('heatSource', 'an electrical standardization needs heater voltage and current (or power) readings: Q = ∫U·I dt');
      }
    } else if (src['kind'] === 'reference-material') {
      if (typeof src['material'] !== 'string' || src['material'].trim() === '') add('heatSource.material', 'is required (e.g. "benzoic acid, NIST SRM 39j")');
      else if (src['material'].length > TEXT_LIMITS.name) add('heatSource.material', tooLong(TEXT_LIMITS.name, src['material'].length));
      quantity(src['mass'], 'heatSource.mass', add, (u) => isUnit('mass', u), 'kg, g, mg', true);
      const me = src['massicEnergy'];
      quantity(me, 'heatSource.massicEnergy', add, (u) => typeof u === 'string' && u in MASSIC_ENERGY_FACTORS, Object.keys(MASSIC_ENERGY_FACTORS).join(', '), true);
      if (isObject(me)) {
        if (me['U'] !== undefined && !(isFinite(me['U']) && me['U'] >= 0)) add('heatSource.massicEnergy.U', 'must be a number of at least 0 (expanded uncertainty)');
        if (me['k'] !== undefined && !(isFinite(me['k']) && me['k'] > 0)) add('heatSource.massicEnergy.k', 'must be a coverage factor greater than 0');
      }
      const corr = src['corrections'];
      if (corr !== undefined) {
        if (!Array.isArray(corr)) add('heatSource.corrections', 'must be an array of { name, energy }');
        else corr.forEach((c, i) => {
          const p = `heatSource.corrections[${i}]`;
          if (!isObject(c)) return add(p, 'must be an object { name, energy }');
          if (typeof c['name'] !== 'string' || c['name'].trim() === '') add(`${p}.name`, 'is required (e.g. "ignition wire")');
          else if (c['name'].length > TEXT_LIMITS.name) add(`${p}.name`, tooLong(TEXT_LIMITS.name, c['name'].length));
          quantity(c['energy'], `${p}.energy`, add, (u) => isUnit('energy', u), 'J, kJ, cal_th, Wh', false);
        });
      }
    } else add('heatSource.kind', `must be "electrical" or "reference-material", got ${JSON.stringify(src['kind'])}`);
  }
  const periods = input['periods'];
  if (periods !== undefined) {
    if (!isObject(periods)) add('periods', 'must be an object { mainStart, mainEnd } in the time channel\'s unit');
    else {
      for (const key of ['mainStart', 'mainEnd']) if (!isFinite(periods[key])) add(`periods.${key}`, `must be a finite number in the time channel's unit, got ${JSON.stringify(periods[key])}`);
      if (isFinite(periods['mainStart']) && isFinite(periods['mainEnd']) && !(periods['mainEnd'] > periods['mainStart'])) add('periods.mainEnd', 'must be later than periods.mainStart');
    }
  }
}
