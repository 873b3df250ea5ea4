import { badRequest } from '../core/problem';
import { createHash, type Hash } from 'node:crypto';
import { columnOf, readingsToSi, type ColumnsInput, type SiColumns } from './readings-columns';
import { parseReadingsJson, type ColumnAt } from './readings-json-parser';
import { parseReadingsInput } from './run-document-mapper';
import { channelNames, type ChannelName, type RunSetup } from './run-setup';
import type { ReplaceReadingsDto } from './runs-dto';

/** Readings per INSERT statement of the bulk path (ten array parameters of this length each). */
export const CHUNK_ROWS = 50_000;

/** What is known of a readings body once it is read and checked, before its statements are made. */
export interface ReadingsHeader {
  /** The version of the run the body was written against. */
  version: number;
  time: RunSetup['time'];
  channels: RunSetup['channels'];
  readings: number;
  /** SQL columns sent, in the order of each chunk's array literals. */
  columns: string[];
  chunkRows: number;
}

/** What prepareReadings hands out, in order: the header, then one message per statement. */
export type PreparedMessage = { header: ReadingsHeader } | { literals: string[] };

/** time.values and channels.<name>.values are read as columns of numbers. */
const readingsColumnAt: ColumnAt = (path) => {
  if (path.length === 2 && path[0] === 'time' && path[1] === 'values') return 'time';
  if (path.length === 3 && path[0] === 'channels' && path[2] === 'values' && typeof path[1] === 'string') return `channel:${path[1]}`;
  return null;
};

/**
 * The readings body checked by hand rather than through class-transformer, which would copy every
 * one of millions of values into new arrays: { version, time, channels } and nothing else; the
 * shapes of time and channels are parseReadingsInput's to check.
 */
export function parseReplaceReadingsBody(body: unknown): ReplaceReadingsDto {
  if (body === null || typeof body !== 'object' || Array.isArray(body)) throw badRequest('The request body must be a JSON object.');
  const b = body as Record<string, unknown>;
  const errors = [];
  if (!Number.isInteger(b['version'])) errors.push({ field: 'version', message: 'version must be the version of the run you are editing (a whole number)' });
  for (const key of Object.keys(b)) if (!['version', 'time', 'channels'].includes(key)) errors.push({ field: key, message: `property ${key} should not exist` });
  if (errors.length) throw badRequest(errors.map((e) => e.message).join('; '), errors);
  return b as unknown as ReplaceReadingsDto;
}

const KEYS = ['current', 'displacement', 'power', 'pressure', 'temperature', 'voltage', 'volume'] as const;
/** Readings turned into text at a time: small enough that the garbage dies young (scavenged, never marked). */
const PIECE = 2000;

/**
 * One statement's worth of readings: each value turned into text once (shortest round-trip decimal,
 * which PostgreSQL reads back to the same double), used both for the array literals of unnest() and
 * for the audit hash's canonical text of each reading (ReadingsHash's format, built here in bulk).
 */
function chunkOf(si: SiColumns, present: ChannelName[], from: number, to: number, hash: Hash): string[] {
  const cols = [si.time, ...present.map((name) => si.channels[name]!)];
  const literals: string[][] = cols.map(() => []);
  const slot = KEYS.map((k) => present.indexOf(k as ChannelName) + 1); // 0: not sent
  const [current, displacement, power, pressure, temperature, voltage, volume] = slot;
  const text: string[] = cols.map(() => '');
  const values = (k: number) => (k === 0 ? 'null' : text[k]);
  for (let start = from; start < to; start += PIECE) {
    const end = Math.min(to, start + PIECE);
    const texts = cols.map(() => new Array<string>(end - start));
    let rows = start > 0 ? ',' : '';
    for (let i = start; i < end; i++) {
      for (let c = 0; c < cols.length; c++) {
        const v = cols[c][i];
        text[c] = Number.isNaN(v) ? 'null' : String(v);
        texts[c][i - start] = text[c];
      }
      rows += `${i > start ? ',' : ''}{"current":${values(current)},"displacement":${values(displacement)},"power":${values(power)},"pressure":${values(pressure)},"seq":${i + 1},"temperature":${values(temperature)},"time":${text[0]},"voltage":${values(voltage)},"volume":${values(volume)}}`;
    }
    hash.update(rows, 'latin1'); // ASCII only: the cheapest encoding
    // PostgreSQL's array input reads null in any case as NULL.
    texts.forEach((t, c) => literals[c].push(t.join(',')));
  }
  return literals.map((parts) => `{${parts.join(',')}}`);
}

/**
 * Reads a PUT /api/runs/:id/readings body from its chunks and does everything that needs no database:
 * the JSON read as columns with the input hygiene of every body, the body's and the readings' shape,
 * the conversion to SI with its range checks (every bad reading named), the audit hash and the
 * statements' array literals, handed out through `emit` as each is made (the header first), so that
 * the database can store one while the next is made. Runs in a worker thread for large bodies.
 */
export async function prepareReadings(chunks: AsyncIterable<Uint8Array>, emit: (message: PreparedMessage) => void | Promise<void>): Promise<{ sha256: string }> {
  const parsed = await parseReadingsJson(chunks, readingsColumnAt);
  const body = parseReplaceReadingsBody(parsed.value);
  const shape = parseReadingsInput(body);
  const column = (name: string) => parsed.columns.get(name) ?? columnOf([]);
  const channels: ColumnsInput['channels'] = {};
  for (const name of Object.keys(shape.channels) as ChannelName[]) {
    channels[name] = { ...shape.channels[name]!, values: column(`channel:${name}`) };
  }
  const { si, time, channels: setup } = readingsToSi({ time: { unit: shape.time.unit, values: column('time') }, channels });
  const present = channelNames.filter((name) => si.channels[name] !== undefined);
  await emit({ header: { version: body.version, time, channels: setup, readings: si.count, columns: ['time', ...present], chunkRows: CHUNK_ROWS } });
  const hash = createHash('sha256').update('[');
  for (let from = 0; from < si.count; from += CHUNK_ROWS) await emit({ literals: chunkOf(si, present, from, Math.min(si.count, from + CHUNK_ROWS), hash) });
  return { sha256: hash.update(']').digest('hex') };
}
