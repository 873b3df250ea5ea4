import type { RunTimeUnit } from '../../contract/api/runs';
import { createHash } from 'node:crypto';
import { badRequest, type FieldError } from '../core/problem';
import { affineToSi, type UnitKind } from '../engine/units';
import { CHANNELS, channelNames, type ChannelName, type ChannelSetup, type RunSetup } from './run-setup';

/**
 * One array of readings as sent, kept as numbers rather than as millions of JS values: `nums[i]` is
 * the number sent at i, NaN where something else was sent; `others` holds what that was (a string,
 * true, an object…), and a NaN with no entry in `others` is a null.
 */
export interface ValueColumn {
  length: number;
  nums: Float64Array;
  others: Map<number, unknown>;
}

/** A column of the values of a JS array (the body of a small request, an import, a run document). */
export function columnOf(values: readonly unknown[]): ValueColumn {
  const nums = new Float64Array(values.length);
  const others = new Map<number, unknown>();
  for (let i = 0; i < values.length; i++) {
    const v = values[i];
    // NaN or Infinity in a JS array is no reading either: kept in others, so that it is reported.
    if (typeof v === 'number' && Number.isFinite(v)) nums[i] = v;
    else {
      nums[i] = NaN;
      if (v !== null) others.set(i, v);
    }
  }
  return { length: values.length, nums, others };
}

/** Readings as people send them, one column per channel, in the channel's own unit. */
export interface ColumnsInput {
  time: { unit: RunTimeUnit; values: ValueColumn };
  channels: Partial<Record<ChannelName, ChannelSetup & { values: ValueColumn }>>;
}

/** Readings in SI: seconds, and one column per channel sent (NaN where a reading is missing). */
export interface SiColumns {
  count: number;
  time: Float64Array;
  channels: Partial<Record<ChannelName, Float64Array>>;
}

export const TIME_FACTORS = { ms: 1e-3, s: 1, min: 60, h: 3600 } as const;
/**
 * Range checks after conversion to SI: a finite entry can overflow once multiplied (1e306 bar is
 * 1e311 Pa, which is no number at all), and values past these bounds are no laboratory reading.
 * 1e15 in SI is far above any channel Qwell records (10¹⁵ Pa, K, m³, V, A, W); a run lasts less than 10¹⁰ s.
 */
export const MAX_SI_MAGNITUDE = 1e15;
export const MAX_SECONDS = 1e10;
/** Problems listed in a refusal (all are counted). */
const LISTED = 100;

/**
 * Converts entered readings to SI columns; every bad cell is reported by channel and reading number
 * (the first hundred listed, all counted), and nothing is returned when any is bad. The conversion is
 * made in place, in the input's own arrays (a million readings are not held twice).
 */
export function readingsToSi(input: ColumnsInput): { si: SiColumns; time: RunSetup['time']; channels: RunSetup['channels'] } {
  const errors: FieldError[] = [];
  let problems = 0;
  const report = (field: string, message: string) => {
    problems += 1;
    if (errors.length < LISTED) errors.push({ field, message });
  };
  const t = input.time.values;
  const n = t.length;
  const seconds = t.nums;
  let origin: string | undefined;
  if (input.time.unit === 'iso') {
    const first = t.others.get(0);
    const ms0 = typeof first === 'string' ? Date.parse(first) : NaN;
    for (let i = 0; i < n; i++) {
      const v = t.others.get(i);
      const ms = typeof v === 'string' ? Date.parse(v) : NaN;
      if (!Number.isFinite(ms)) report(`time.values[${i}]`, `reading ${i + 1}: not an ISO 8601 timestamp`);
      seconds[i] = (ms - ms0) / 1000;
    }
    origin = typeof first === 'string' ? first : undefined;
  } else {
    const factor = TIME_FACTORS[input.time.unit];
    for (let i = 0; i < n; i++) {
      const v = t.nums[i];
      if (!Number.isFinite(v)) {
        report(`time.values[${i}]`, `reading ${i + 1}: time must be a number`);
        continue;
      }
      const si = v * factor;
      if (!(Math.abs(si) <= MAX_SECONDS)) report(`time.values[${i}]`, `reading ${i + 1}: ${v} ${input.time.unit} is beyond any run's length (at most ${MAX_SECONDS} s)`);
      seconds[i] = si;
    }
  }
  const channels: NonNullable<RunSetup['channels']> = {};
  const columns: SiColumns['channels'] = {};
  for (const name of channelNames) {
    const channel = input.channels[name];
    if (!channel) continue;
    const kind: UnitKind = CHANNELS[name];
    const col = channel.values;
    if (col.length !== n) {
      report(`${name}.values`, `${name} has ${col.length} readings but time has ${n}; every channel needs one value per time point`);
      continue;
    }
    let affine;
    try {
      affine = affineToSi(kind, channel.unit);
    } catch {
      report(`${name}.unit`, `"${channel.unit}" is not a ${name} unit Qwell knows`);
      continue;
    }
    const out = col.nums;
    for (let i = 0; i < n; i++) {
      const v = col.nums[i];
      if (Number.isNaN(v)) {
        out[i] = NaN;
        if (col.others.has(i)) report(`${name}.values[${i}]`, `reading ${i + 1}: ${name} must be a number, got ${JSON.stringify(col.others.get(i))}`);
        continue;
      }
      const si = affine.factor * v + affine.offset;
      if (!(Math.abs(si) <= MAX_SI_MAGNITUDE)) {
        report(`${name}.values[${i}]`, `reading ${i + 1}: ${v} ${channel.unit} is beyond any measurable ${name} once converted to SI units`);
        out[i] = NaN;
        continue;
      }
      out[i] = si;
    }
    columns[name] = out;
    const { values: _values, ...meta } = channel;
    channels[name] = meta;
  }
  if (problems) throw badRequest(`${problems} problem(s) in the readings; nothing was saved.`, errors);
  return { si: { count: n, time: seconds, channels: columns }, time: { unit: input.time.unit, ...(origin ? { origin } : {}) }, channels };
}

/** A reading as the audit trail hashes it (ReadingRow's fields; null where a channel has no reading). */
export interface ReadingValues {
  seq: number; time: number; pressure: number | null; volume: number | null; displacement: number | null;
  temperature: number | null; voltage: number | null; current: number | null; power: number | null;
}

const canonicalNumber = (v: number | null): string => {
  if (v === null) return 'null';
  if (!Number.isFinite(v)) throw new Error('canonical JSON has no NaN or Infinity');
  return Object.is(v, -0) ? '0' : String(v);
};

/** Readings per piece of the audit hash's text. */
const HASH_PIECE = 10_000;

/**
 * sha256Canonical of a list of readings, fed one reading at a time without the general walker (which
 * sorts keys and calls JSON.stringify per value): the same bytes, keys in code-unit order, shortest
 * round-trip numbers, null.
 */
export class ReadingsHash {
  private readonly hash = createHash('sha256');
  private piece = '';
  private inPiece = 0;
  private count = 0;

  constructor() {
    this.hash.update('[');
  }

  add(r: ReadingValues): void {
    this.piece += `${this.count > 0 ? ',' : ''}{"current":${canonicalNumber(r.current)},"displacement":${canonicalNumber(r.displacement)},"power":${canonicalNumber(r.power)},"pressure":${canonicalNumber(r.pressure)},"seq":${canonicalNumber(r.seq)},"temperature":${canonicalNumber(r.temperature)},"time":${canonicalNumber(r.time)},"voltage":${canonicalNumber(r.voltage)},"volume":${canonicalNumber(r.volume)}}`;
    this.count += 1;
    if (++this.inPiece === HASH_PIECE) {
      this.hash.update(this.piece);
      this.piece = '';
      this.inPiece = 0;
    }
  }

  /** The hash, and how many readings went into it. */
  digest(): { readings: number; sha256: string } {
    this.hash.update(this.piece);
    this.hash.update(']');
    return { readings: this.count, sha256: this.hash.digest('hex') };
  }
}

/** The reading at i of SI columns. */
export function readingAt(si: SiColumns, i: number): ReadingValues {
  const c = si.channels;
  const at = (col: Float64Array | undefined) => (col === undefined || Number.isNaN(col[i]) ? null : col[i]);
  return {
    seq: i + 1, time: si.time[i], pressure: at(c.pressure), volume: at(c.volume), displacement: at(c.displacement),
    temperature: at(c.temperature), voltage: at(c.voltage), current: at(c.current), power: at(c.power),
  };
}
