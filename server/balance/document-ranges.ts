import type { FieldError } from '../core/problem';
import { CHANNEL_KINDS } from '../engine/run-document';
import { isUnit, toSi, type UnitKind } from '../engine/units';
import { MAX_SECONDS, MAX_SI_MAGNITUDE } from '../runs/run-document-mapper';

const TIME_FACTORS: Record<string, number> = { ms: 1e-3, s: 1, min: 60, h: 3600 };
const isObject = (v: unknown): v is Record<string, unknown> => typeof v === 'object' && v !== null && !Array.isArray(v);

/**
 * Readings of a run document that are finite as written but not once converted to SI (1e306 bar,
 * 1e308 h): the engine would compute with infinities. Checked before the engine sees the document;
 * the document's other problems are the engine's validation's to name.
 */
export function documentRangeProblems(doc: unknown, max = 20): FieldError[] {
  const problems: FieldError[] = [];
  if (!isObject(doc) || !isObject(doc['readings'])) return problems;
  const readings = doc['readings'];
  const check = (field: string, values: unknown, toSiValue: (v: number) => number, bound: number, what: string) => {
    if (!Array.isArray(values)) return;
    for (let i = 0; i < values.length && problems.length < max; i++) {
      const v: unknown = values[i];
      if (typeof v !== 'number' || !Number.isFinite(v)) continue;
      if (!(Math.abs(toSiValue(v)) <= bound)) problems.push({ field: `${field}.values[${i}]`, message: `reading ${i + 1}: ${v} is beyond any measurable ${what} once converted to SI units` });
    }
  };
  const time = readings['time'];
  if (isObject(time) && typeof time['unit'] === 'string' && TIME_FACTORS[time['unit']] !== undefined) {
    const factor = TIME_FACTORS[time['unit']];
    check('readings.time', time['values'], (v) => v * factor, MAX_SECONDS, 'time');
  }
  for (const [name, kind] of Object.entries(CHANNEL_KINDS) as Array<[string, UnitKind]>) {
    const channel = readings[name];
    if (!isObject(channel) || !isUnit(kind, channel['unit'])) continue;
    const unit = channel['unit'] as string;
    check(`readings.${name}`, channel['values'], (v) => toSi(kind, unit, v), MAX_SI_MAGNITUDE, name);
  }
  return problems;
}
