import { count } from 'drizzle-orm';
import type { Database } from '../db/client';
import { imports, readings, runs, uploads } from '../db/schema';
import type { ApiClient } from './api-harness';

/** Row counts of everything an import may write; a refused file must leave all four unchanged. */
export async function importCounts(db: Database) {
  const [[u], [i], [r], [x]] = await Promise.all([
    db.select({ n: count() }).from(uploads),
    db.select({ n: count() }).from(imports),
    db.select({ n: count() }).from(runs),
    db.select({ n: count() }).from(readings),
  ]);
  return { uploads: u.n, imports: i.n, runs: r.n, readings: x.n };
}

/** A multipart upload through a signed-in test client (the harness client has JSON helpers only). */
export function uploadFile(client: ApiClient, filename: string, content: Buffer, fields: Record<string, string> = {}) {
  // A browser's HttpClient sends the same header for multipart posts.
  let req = client.agent.post('/api/imports').set('X-XSRF-TOKEN', client.xsrfToken);
  for (const [k, v] of Object.entries(fields)) req = req.field(k, v);
  return req.attach('file', content, filename);
}

export const csv = (lines: string[]) => Buffer.from(lines.join('\n') + '\n', 'utf8');
