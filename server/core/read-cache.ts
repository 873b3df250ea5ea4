import type { Request, Response } from 'express';
import { gzipSync } from 'node:zlib';

interface CachedAnswer {
  body: Buffer;
  etag: string | undefined;
  /** The body gzipped, made on the first request that accepts gzip. */
  gzipped?: Buffer;
}

/**
 * Answers to frequent reads (the run list, a run's stored result) kept while the "records" data
 * version that the session reader read stays the same. Every commit that changes what these
 * answers show adds one to that version in the database (migration 0004), and the version is read
 * before the answer's own queries, so an answer is never served to a request that could already
 * see a newer commit. Each API process keeps its own copy; only successful answers are kept, and
 * a newer version empties the cache, which also bounds its memory.
 */
// Below this size gzip saves too little to be worth a header.
const GZIP_FROM_BYTES = 1024;

export class ReadCache {
  private version = -1;
  private readonly answers = new Map<string, CachedAnswer>();
  // Loads under way, so that the requests arriving together after a change share one load.
  private readonly loading = new Map<string, Promise<CachedAnswer>>();

  constructor(private readonly maxAnswers = 2000, private readonly enabled = true) {}

  /** Sends load()'s answer as JSON, from the cache when the records have not changed since it was made. */
  async json(req: Request, res: Response, load: () => Promise<unknown>): Promise<void> {
    const version = req.recordsVersion;
    if (!this.enabled || version === undefined || version < this.version) {
      res.json(await load()); // off, no version, or older than one this process has seen: read through
      return;
    }
    if (version > this.version) {
      this.answers.clear();
      this.version = version;
    }
    // Who asks matters: visibility follows the person's role and project memberships.
    const key = `${req.person?.id ?? '-'}:${req.person?.role ?? '-'}:${req.originalUrl}`;
    let answer = this.answers.get(key);
    if (!answer) {
      const flightKey = `${version}:${key}`;
      let flight = this.loading.get(flightKey);
      if (!flight) {
        flight = this.build(req, load).finally(() => this.loading.delete(flightKey));
        this.loading.set(flightKey, flight);
      }
      answer = await flight;
      if (this.version === version) {
        if (this.answers.size >= this.maxAnswers) this.answers.clear();
        this.answers.set(key, answer);
      }
    }
    if (answer.etag) res.set('ETag', answer.etag);
    res.vary('Accept-Encoding').type('json');
    // Compressed once per answer, not per response: a page of the run list shrinks about sevenfold.
    if (answer.body.length >= GZIP_FROM_BYTES && req.acceptsEncodings('gzip', 'identity') === 'gzip') {
      answer.gzipped ??= gzipSync(answer.body);
      res.set('Content-Encoding', 'gzip').send(answer.gzipped);
    } else {
      res.send(answer.body);
    }
  }

  private async build(req: Request, load: () => Promise<unknown>): Promise<CachedAnswer> {
    const body = Buffer.from(JSON.stringify(await load()));
    const etagOf = req.app.get('etag fn') as ((body: Buffer, encoding?: string) => string) | undefined;
    return { body, etag: etagOf?.(body) };
  }

  /** Number of answers kept (for tests). */
  get size(): number {
    return this.answers.size;
  }
}
