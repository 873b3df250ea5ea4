import { sql } from 'drizzle-orm';
import type { DbOrTx } from '../../db/client';
import { runs } from '../../db/schema';

/** Next people-facing code, R-<year>-<nnnn>, unique across revisions (call it inside the creating transaction). */
export async function nextCode(tx: DbOrTx, runDate: string): Promise<string> {
  const year = runDate.slice(0, 4);
  await tx.execute(sql`SELECT pg_advisory_xact_lock(7004313)`);
  const [{ n }] = await tx.select({ n: sql<number>`count(DISTINCT ${runs.code})::int` }).from(runs).where(sql`${runs.code} LIKE ${`R-${year}-%`}`);
  return `R-${year}-${String(n + 1).padStart(4, '0')}`;
}
