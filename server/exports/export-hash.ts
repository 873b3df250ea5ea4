import { createHash, type Hash } from 'node:crypto';
import { createReadStream } from 'node:fs';
import { canonicalJson } from '../core/canonical-json';

/**
 * SHA-256 of canonicalJson(rows) computed one row at a time: the canonical JSON of an array is "[",
 * the rows' canonical JSON joined by ",", and "]", so a trail of any length never sits in memory.
 */
export class RowsHasher {
  private readonly hash: Hash = createHash('sha256').update('[');
  private count = 0;

  add(row: unknown): void {
    if (this.count > 0) this.hash.update(',');
    this.hash.update(canonicalJson(row));
    this.count += 1;
  }

  get rows(): number {
    return this.count;
  }

  digest(): string {
    return this.hash.update(']').digest('hex');
  }
}

/** SHA-256 of a file on disk, read as a stream; hex and base64. */
export async function fileSha256(path: string): Promise<{ hex: string; base64: string }> {
  const hash = createHash('sha256');
  for await (const chunk of createReadStream(path)) hash.update(chunk as Buffer);
  const digest = hash.digest();
  return { hex: digest.toString('hex'), base64: digest.toString('base64') };
}

/** The RFC 9530 Content-Digest field value for a SHA-256 digest given in base64. */
export function contentDigest(base64: string): string {
  return `sha-256=:${base64}:`;
}
