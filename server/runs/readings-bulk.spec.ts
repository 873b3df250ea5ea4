import { eq, TransactionRollbackError } from 'drizzle-orm';
import { readings, runs } from '../../db/schema';
import { sha256Canonical } from '../engine/canonical';
import { startHarness, type ApiHarness } from '../../testing/api-harness';
import { readingsToRows, type ReadingRow, type ReadingsInput } from './run-document-mapper';
import type { HttpProblem } from '../core/problem';
import { BULK_FROM_ROWS, hashStoredReadings, insertReadingChunks, insertReadings, sha256ReadingRows } from './readings-bulk';
import { CHUNK_ROWS, prepareReadings, type PreparedMessage, type ReadingsHeader } from './readings-prepare';
import { loadReadings } from './run-loader';

const row = (seq: number, over: Partial<ReadingRow> = {}): ReadingRow => ({
  seq, time: seq * 0.1, pressure: null, volume: null, displacement: null, temperature: null, voltage: null, current: null, power: null, ...over,
});

describe('sha256ReadingRows', () => {
  it('hashes exactly what sha256Canonical hashes for the same rows (the audit trail\'s readings hash)', () => {
    const rows = [
      row(1, { pressure: 101325, temperature: 298.15, volume: 1e-3 }),
      row(2, { pressure: 1.5e-7, temperature: -0, displacement: 0.123456789012345 }),
      row(3, { voltage: 12, current: 0.25, power: 3 }),
      ...Array.from({ length: 25_000 }, (_, i) => row(i + 4, { pressure: 100000 + i / 3, temperature: 300 - i / 7 })),
    ];
    expect(sha256ReadingRows(rows)).toBe(sha256Canonical(rows));
    expect(sha256ReadingRows([])).toBe(sha256Canonical([]));
  });

  it('refuses NaN as the canonical form does', () => {
    expect(() => sha256ReadingRows([row(1, { pressure: NaN })])).toThrow(/NaN/);
  });
});

describe('insertReadings on the database', () => {
  let h: ApiHarness;
  beforeAll(async () => {
    h = await startHarness();
  });
  afterAll(() => h.close());

  const someRun = async () => (await h.handle.db.select({ id: runs.id }).from(runs).where(eq(runs.state, 'draft')).limit(1))[0].id;

  it('by the bulk path (from 5000 rows), reads back every double bit for bit, nulls as nulls, in one transaction', async () => {
    const runId = await someRun();
    const rows = Array.from({ length: BULK_FROM_ROWS + 1234 }, (_, i) => row(i + 1, {
      time: i * 0.1 + 1e-12, pressure: 101325 / (i + 1) + Math.PI, temperature: i % 7 === 0 ? null : 273.15 + Math.sqrt(i), volume: i === 3 ? 5e-324 : 1e-3 * (1 + i / 3),
    }));
    await h.handle.db.transaction(async (tx) => {
      await tx.delete(readings).where(eq(readings.runId, runId));
      await insertReadings(tx, runId, rows);
      const back = await loadReadings(tx, runId);
      expect(back).toHaveLength(rows.length);
      expect(back).toEqual(rows);
      expect(sha256ReadingRows(back)).toBe(sha256ReadingRows(rows));
      tx.rollback();
    }).catch((e: unknown) => {
      if (!(e instanceof TransactionRollbackError)) throw e;
    });
  });

  it('refuses readings of a run that does not exist, by the bulk path and by INSERT (the statement-level check of migration 0008)', async () => {
    const rows = Array.from({ length: BULK_FROM_ROWS }, (_, i) => row(i + 1));
    for (const batch of [rows, rows.slice(0, 3)]) {
      const error = await h.handle.db.transaction(async (tx) => insertReadings(tx, 2_000_000_000, batch)).then(() => null, (e: { code?: string; cause?: { code?: string } }) => e);
      expect(error?.code ?? error?.cause?.code).toBe('23503');
    }
  });

  it('deletes a run\'s readings with the run, as the former ON DELETE CASCADE did', async () => {
    const [template] = await h.handle.db.select().from(runs).where(eq(runs.state, 'draft')).limit(1);
    await h.handle.db.transaction(async (tx) => {
      const [run] = await tx.insert(runs).values({
        code: 'R-1999-0001', projectId: template.projectId, authorId: template.authorId, title: 'Deleted with its readings', process: 'isothermal', runDate: '1999-01-01', setup: {},
      }).returning();
      await insertReadings(tx, run.id, [row(1, { pressure: 1 }), row(2, { pressure: 2 })]);
      expect(await loadReadings(tx, run.id)).toHaveLength(2);
      await tx.delete(runs).where(eq(runs.id, run.id));
      expect(await loadReadings(tx, run.id)).toEqual([]);
      tx.rollback();
    }).catch((e: unknown) => {
      if (!(e instanceof TransactionRollbackError)) throw e;
    });
  });
});

describe('prepareReadings (the PUT body read as columns) and its chunks stored', () => {
  let h: ApiHarness;
  beforeAll(async () => {
    h = await startHarness();
  });
  afterAll(() => h.close());

  const n = CHUNK_ROWS + 1234;
  const input: ReadingsInput = {
    time: { unit: 'min', values: Array.from({ length: n }, (_, i) => i / 60 + 1e-9 * i) },
    channels: {
      pressure: { unit: 'bar', reference: 'gauge', values: Array.from({ length: n }, (_, i) => (i % 11 === 0 ? null : 1.01325 + Math.sin(i) / 3)) },
      temperature: { unit: 'degC', values: Array.from({ length: n }, (_, i) => (i === 7 ? -0 : 25 + i / 1e5)) },
      current: { unit: 'mA', instrumentId: 4, values: Array.from({ length: n }, (_, i) => 250.5 + (i % 3)) },
    },
  };
  const bodyOf = (body: object) => (async function* () {
    const bytes = Buffer.from(JSON.stringify(body));
    for (let i = 0; i < bytes.length; i += 9999) yield bytes.subarray(i, i + 9999);
  })();

  async function prepare(body: object) {
    const messages: PreparedMessage[] = [];
    const { sha256 } = await prepareReadings(bodyOf(body), (m) => {
      messages.push(m);
    });
    const [first, ...rest] = messages;
    return { header: (first as { header: ReadingsHeader }).header, chunks: rest.map((m) => (m as { literals: string[] }).literals), sha256 };
  }

  it('gives the rows, setup and audit hash of readingsToRows, and stores them bit for bit by chunks', async () => {
    const { header, chunks, sha256 } = await prepare({ version: 4, ...input });
    const expected = readingsToRows(input);
    expect(header).toEqual({ version: 4, time: expected.time, channels: expected.channels, readings: n, columns: ['time', 'pressure', 'temperature', 'current'], chunkRows: CHUNK_ROWS });
    expect(chunks).toHaveLength(2);
    expect(sha256).toBe(sha256ReadingRows(expected.rows));
    expect(sha256).toBe(sha256Canonical(expected.rows));
    const [{ id: runId }] = await h.handle.db.select({ id: runs.id }).from(runs).where(eq(runs.state, 'draft')).limit(1);
    await h.handle.db.transaction(async (tx) => {
      await tx.delete(readings).where(eq(readings.runId, runId));
      await insertReadingChunks(tx, runId, header, (async function* () { yield* chunks; })());
      const back = await loadReadings(tx, runId);
      expect(back).toEqual(expected.rows);
      expect(await hashStoredReadings(tx, runId)).toEqual({ readings: n, sha256 });
      tx.rollback();
    }).catch((e: unknown) => {
      if (!(e instanceof TransactionRollbackError)) throw e;
    });
  }, 60_000);

  it('refuses bad readings with exactly the problems readingsToRows names', async () => {
    const bad = JSON.parse(JSON.stringify(input)) as { time: { values: unknown[] }; channels: Record<string, { values: unknown[]; unit: string }> };
    bad.channels['pressure'].values[3] = 1e306;
    bad.channels['pressure'].values[9] = 'high';
    bad.channels['temperature'].values.pop();
    bad.time.values[5] = 1e308;
    const expected = (() => {
      try {
        readingsToRows(bad as unknown as ReadingsInput);
      } catch (err) {
        return err as HttpProblem;
      }
      throw new Error('readingsToRows took the bad readings');
    })();
    await expect(prepare({ version: 1, ...bad })).rejects.toEqual(expected);
    expect(expected.errors!.map((e) => e.field)).toEqual(['time.values[5]', 'pressure.values[3]', 'pressure.values[9]', 'temperature.values']);
  }, 60_000);
});
