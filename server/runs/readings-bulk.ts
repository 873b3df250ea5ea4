import { createHash } from 'node:crypto';
import type postgres from 'postgres';
import type { DbOrTx } from '../../db/client';
import { readings } from '../../db/schema';
import type { ReadingRow } from './run-document-mapper';

// 10 columns × 5000 rows stays well under PostgreSQL's 65 535 parameters per statement.
const READINGS_PER_STATEMENT = 5000;
/** From this many readings on, the bulk path: one statement per 50 000 readings, ten array parameters each. */
export const BULK_FROM_ROWS = 5000;
const BULK_CHUNK = 50_000;
/** Readings per piece of the audit hash's text. */
const HASH_CHUNK = 10_000;

/** The postgres.js connection under a Drizzle database or transaction (the bulk insert binds arrays through it). */
function driverOf(db: DbOrTx): postgres.Sql {
  const handle = db as unknown as { session?: { client?: postgres.Sql }; $client?: postgres.Sql };
  const client = handle.session?.client ?? handle.$client;
  if (!client) throw new Error('no postgres.js client under this Drizzle handle');
  return client;
}

/**
 * Stores a run's readings inside the caller's transaction: multi-row inserts of bound values for a
 * few thousand; for more, INSERT … SELECT FROM unnest(arrays), one statement per 50 000 readings
 * (10⁶ readings in seconds). Not COPY: the driver (postgres.js 3.4) never settles a COPY that the
 * server refuses at its end, such as the statement-level run check of migration 0008.
 */
export async function insertReadings(tx: DbOrTx, runId: number, rows: readonly ReadingRow[]): Promise<void> {
  if (rows.length < BULK_FROM_ROWS) {
    for (let i = 0; i < rows.length; i += READINGS_PER_STATEMENT) {
      await tx.insert(readings).values(rows.slice(i, i + READINGS_PER_STATEMENT).map((r) => ({ ...r, runId })));
    }
    return;
  }
  const sql = driverOf(tx);
  for (let start = 0; start < rows.length; start += BULK_CHUNK) {
    const part = rows.slice(start, start + BULK_CHUNK);
    // Each column as one array literal: numbers as shortest round-trip decimal text (PostgreSQL reads
    // them back to the same double), NULL for a gap. Written here: the driver's own array encoding
    // quotes and escapes each element, several times slower.
    const col = (key: keyof ReadingRow) => `{${part.map((r) => (r[key] === null ? 'NULL' : String(r[key]))).join(',')}}`;
    await sql`INSERT INTO readings (run_id, seq, time, pressure, volume, displacement, temperature, voltage, current, power)
      SELECT ${runId}::int, * FROM unnest(${col('seq')}::int[], ${col('time')}::float8[], ${col('pressure')}::float8[],
        ${col('volume')}::float8[], ${col('displacement')}::float8[], ${col('temperature')}::float8[], ${col('voltage')}::float8[],
        ${col('current')}::float8[], ${col('power')}::float8[])`;
  }
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
  for (let start = 0; start < rows.length; start += HASH_CHUNK) {
    let chunk = '';
    for (let i = start; i < Math.min(rows.length, start + HASH_CHUNK); i++) {
      const r = rows[i];
      chunk += `${i > 0 ? ',' : ''}{"current":${num(r.current)},"displacement":${num(r.displacement)},"power":${num(r.power)},"pressure":${num(r.pressure)},"seq":${num(r.seq)},"temperature":${num(r.temperature)},"time":${num(r.time)},"voltage":${num(r.voltage)},"volume":${num(r.volume)}}`;
    }
    hash.update(chunk);
  }
  hash.update(']');
  return hash.digest('hex');
}
