import type postgres from 'postgres';
import type { DbOrTx } from '../../db/client';
import { readings } from '../../db/schema';
import { ReadingsHash, type ReadingValues } from './readings-columns';
import type { ReadingRow } from './run-document-mapper';

// 10 columns × 5000 rows stays well under PostgreSQL's 65 535 parameters per statement.
const READINGS_PER_STATEMENT = 5000;
/** From this many readings on, the bulk path: one statement per 50 000 readings, ten array parameters each. */
export const BULK_FROM_ROWS = 5000;
const BULK_CHUNK = 50_000;

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

/** sha256Canonical(rows) for readings rows (see ReadingsHash). */
export function sha256ReadingRows(rows: readonly ReadingRow[]): string {
  const hash = new ReadingsHash();
  for (const r of rows) hash.add(r);
  return hash.digest().sha256;
}

/** Readings fetched per round trip when a stored run's readings are hashed. */
const STORED_PIECE = 20_000;

/**
 * The hash and count of a run's stored readings (what sha256ReadingRows(loadReadings(…)) gives), read
 * in pieces through a cursor so that a run of a million readings is never held at once, and the event
 * loop gets a turn between pieces.
 */
export async function hashStoredReadings(tx: DbOrTx, runId: number): Promise<{ readings: number; sha256: string }> {
  const sql = driverOf(tx);
  const hash = new ReadingsHash();
  await sql`SELECT seq, time, pressure, volume, displacement, temperature, voltage, current, power FROM readings WHERE run_id = ${runId} ORDER BY seq`
    .cursor(STORED_PIECE, async (rows) => {
      for (const r of rows) hash.add(r as unknown as ReadingValues);
      await new Promise((resolve) => setImmediate(resolve));
    });
  return hash.digest();
}

/**
 * Stores prepared readings (readings-prepare.ts) inside the caller's transaction as their chunks come:
 * INSERT … SELECT FROM unnest(arrays) WITH ORDINALITY, one statement per chunk of `chunkRows` readings;
 * the event loop is free while PostgreSQL works on each.
 */
export async function insertReadingChunks(tx: DbOrTx, runId: number, shape: { columns: string[]; chunkRows: number }, chunks: AsyncIterable<string[]>): Promise<void> {
  const sql = driverOf(tx);
  const cols = shape.columns;
  const query = `INSERT INTO readings (run_id, seq, ${cols.join(', ')})
    SELECT $1::int, $2::int + t.ord::int, ${cols.map((c) => `t.${c}`).join(', ')}
    FROM unnest(${cols.map((_, k) => `$${k + 3}::float8[]`).join(', ')}) WITH ORDINALITY AS t(${cols.join(', ')}, ord)`;
  // The run check of migration 0008 keeps each statement's new rows in memory: 50 000 readings are
  // about 5 MB, more than the default work_mem, which would spill them to a temporary file.
  await sql`SET LOCAL work_mem = '32MB'`;
  let from = 0;
  for await (const literals of chunks) {
    await sql.unsafe(query, [runId, from, ...literals]);
    from += shape.chunkRows;
  }
}
