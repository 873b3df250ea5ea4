import { createHash } from 'node:crypto';
import { Readable } from 'node:stream';
import { pipeline } from 'node:stream/promises';
import type postgres from 'postgres';
import type { DbOrTx } from '../../db/client';
import { readings } from '../../db/schema';
import type { ReadingRow } from './run-document-mapper';

// 10 columns × 5000 rows stays well under PostgreSQL's 65 535 parameters per statement.
const READINGS_PER_STATEMENT = 5000;
/** From this many readings on, COPY: one statement streaming text, instead of statements of bound parameters. */
export const COPY_FROM_ROWS = 5000;
/** Readings per chunk written into the COPY stream. */
const COPY_CHUNK = 10_000;

/** The postgres.js connection under a Drizzle database or transaction (COPY needs the driver itself). */
function driverOf(db: DbOrTx): postgres.Sql {
  const handle = db as unknown as { session?: { client?: postgres.Sql }; $client?: postgres.Sql };
  const client = handle.session?.client ?? handle.$client;
  if (!client) throw new Error('no postgres.js client under this Drizzle handle');
  return client;
}

// PostgreSQL reads shortest round-trip decimal text back to the same double; \N is NULL in COPY's text format.
const cell = (v: number | null) => (v === null ? '\\N' : String(v));

function* copyText(runId: number, rows: readonly ReadingRow[]): Generator<string> {
  for (let start = 0; start < rows.length; start += COPY_CHUNK) {
    let chunk = '';
    for (let i = start; i < Math.min(rows.length, start + COPY_CHUNK); i++) {
      const r = rows[i];
      chunk += `${runId}\t${r.seq}\t${cell(r.time)}\t${cell(r.pressure)}\t${cell(r.volume)}\t${cell(r.displacement)}\t${cell(r.temperature)}\t${cell(r.voltage)}\t${cell(r.current)}\t${cell(r.power)}\n`;
    }
    yield chunk;
  }
}

/**
 * Stores a run's readings inside the caller's transaction: multi-row inserts for a few thousand,
 * COPY FROM STDIN for more (10⁶ readings in seconds, streamed in chunks rather than built as one text).
 */
export async function insertReadings(tx: DbOrTx, runId: number, rows: readonly ReadingRow[]): Promise<void> {
  if (rows.length < COPY_FROM_ROWS) {
    for (let i = 0; i < rows.length; i += READINGS_PER_STATEMENT) {
      await tx.insert(readings).values(rows.slice(i, i + READINGS_PER_STATEMENT).map((r) => ({ ...r, runId })));
    }
    return;
  }
  const writable = await driverOf(tx)`COPY readings (run_id, seq, time, pressure, volume, displacement, temperature, voltage, current, power) FROM STDIN`.writable();
  await pipeline(Readable.from(copyText(runId, rows)), writable);
}

const num = (v: number | null): string => {
  if (v === null) return 'null';
  if (!Number.isFinite(v)) throw new Error('canonical JSON has no NaN or Infinity');
  return Object.is(v, -0) ? '0' : String(v);
};

/**
 * sha256Canonical(rows) for readings rows, written row by row without the general walker (which
 * sorts keys and calls JSON.stringify per value: half a minute for 10⁶ rows on a busy machine).
 * The same bytes go into the hash: keys in code-unit order, shortest round-trip numbers, null.
 */
export function sha256ReadingRows(rows: readonly ReadingRow[]): string {
  const hash = createHash('sha256');
  hash.update('[');
  for (let start = 0; start < rows.length; start += COPY_CHUNK) {
    let chunk = '';
    for (let i = start; i < Math.min(rows.length, start + COPY_CHUNK); i++) {
      const r = rows[i];
      chunk += `${i > 0 ? ',' : ''}{"current":${num(r.current)},"displacement":${num(r.displacement)},"power":${num(r.power)},"pressure":${num(r.pressure)},"seq":${num(r.seq)},"temperature":${num(r.temperature)},"time":${num(r.time)},"voltage":${num(r.voltage)},"volume":${num(r.volume)}}`;
    }
    hash.update(chunk);
  }
  hash.update(']');
  return hash.digest('hex');
}
