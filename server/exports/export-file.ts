import type { Response } from 'express';
import { createReadStream } from 'node:fs';
import { mkdtemp, rm, stat } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { pipeline } from 'node:stream/promises';
import { contentDigest } from './export-hash';

/** A temporary folder for one export; the file is built there, hashed, sent, then removed. */
export async function withTempFile<T>(name: string, work: (path: string) => Promise<T>): Promise<T> {
  const dir = await mkdtemp(join(tmpdir(), 'qwell-export-'));
  try {
    return await work(join(dir, name));
  } finally {
    await rm(dir, { recursive: true, force: true });
  }
}

/** Sends a built file as an attachment with its SHA-256 (RFC 9530 Content-Digest and a plain hex header). */
export async function sendExport(res: Response, path: string, file: { name: string; type: string; sha256: { hex: string; base64: string } }): Promise<void> {
  res.status(200);
  res.type(file.type);
  res.attachment(file.name);
  res.set('Content-Digest', contentDigest(file.sha256.base64));
  res.set('X-Qwell-Export-SHA256', file.sha256.hex);
  res.set('Cache-Control', 'no-store');
  res.set('Content-Length', String((await stat(path)).size));
  await pipeline(createReadStream(path), res);
}
