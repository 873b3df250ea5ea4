import type { Request, RequestHandler } from 'express';
import { join } from 'node:path';
import { Readable } from 'node:stream';
import { createBrotliDecompress, createGunzip, createInflate } from 'node:zlib';
import { runOffThread } from '../core/off-thread';
import { HttpProblem } from '../core/problem';
import { prepareReadings, type PreparedMessage, type ReadingsHeader } from './readings-prepare';

/** PUT /api/runs/:id/readings, whose body the global JSON parser leaves to readingsBody. */
export const isReadingsPut = (req: Request): boolean => req.method === 'PUT' && /^\/api\/runs\/[^/]+\/readings\/?$/.test(req.path);

/** Largest readings body (QWELL_READINGS_MAX_MB, default 256): 10⁶ time points of six channels are about 90 MB of JSON. */
export function readingsMaxMb(): number {
  const raw = Number(process.env['QWELL_READINGS_MAX_MB'] ?? 256);
  return Number.isFinite(raw) && raw > 0 ? raw : 256;
}

/**
 * Bodies from this size on are read in a worker thread. Below it the read takes a few milliseconds on
 * the event loop, less than starting a worker; a body of unknown length (chunked) goes to the worker.
 */
export const OFF_THREAD_FROM_BYTES = 512 * 1024;

const tooLarge = () => new HttpProblem(413, 'Too large', `The readings are larger than the server accepts (${readingsMaxMb()} MB of JSON); send them in a smaller unit of time, or fewer channels per request.`);

/** The body's bytes as they arrive, decompressed as the client declared, refused past the size limit. */
async function* bodyBytes(req: Request, maxBytes: number): AsyncGenerator<Uint8Array> {
  const encoding = String(req.headers['content-encoding'] ?? 'identity').toLowerCase();
  const decoders: Record<string, (() => NodeJS.ReadWriteStream) | null> = { identity: null, gzip: createGunzip, deflate: createInflate, br: createBrotliDecompress };
  if (!(encoding in decoders)) throw new HttpProblem(415, 'Unsupported encoding', `The body's content encoding "${encoding}" is not one Qwell reads (gzip, deflate, br or none).`);
  const decoder = decoders[encoding];
  const source: Readable = decoder ? req.pipe(decoder() as unknown as NodeJS.WritableStream & Readable) : req;
  let seen = 0;
  try {
    for await (const chunk of source) {
      seen += (chunk as Buffer).length;
      if (seen > maxBytes) throw tooLarge();
      yield chunk as Buffer;
    }
  } catch (err) {
    if (err instanceof HttpProblem) throw err;
    throw new HttpProblem(400, 'Bad request', 'The request body could not be read to its end (cut short, or not compressed as it says).');
  }
}

/**
 * A readings body on its way: the header once the body is read and checked, then one chunk of array
 * literals per statement as the preparation makes them, then the audit hash. The route stores each
 * chunk while the next is made; stop() ends the preparation when the store fails.
 */
export class ReadingsFeed {
  private readonly queue: PreparedMessage[] = [];
  private wake: (() => void) | null = null;
  private finished: { sha256: string } | null = null;
  private failed: unknown = null;
  private readonly abort = new AbortController();

  private readonly acks: Array<() => void> = [];

  constructor(start: (emit: (m: PreparedMessage, ack?: () => void) => void, signal: AbortSignal) => Promise<{ sha256: string }>) {
    start((m, ack) => {
      if (ack) this.acks.push(ack);
      this.push(m);
    }, this.abort.signal).then((end) => {
      this.finished = end;
      this.poke();
    }, (err: unknown) => {
      this.failed = err;
      this.poke();
    });
  }

  private push(m: PreparedMessage): void {
    this.queue.push(m);
    this.poke();
  }

  private poke(): void {
    this.wake?.();
    this.wake = null;
  }

  private async next(): Promise<PreparedMessage | null> {
    for (;;) {
      if (this.queue.length) {
        this.acks.shift()?.(); // the preparation may make the next chunk now
        return this.queue.shift()!;
      }
      if (this.failed) throw this.failed;
      if (this.finished) return null;
      await new Promise<void>((resolve) => { this.wake = resolve; });
    }
  }

  /** The header: the first message (a refused body rejects here, before any database work). */
  async header(): Promise<ReadingsHeader> {
    const m = await this.next();
    if (!m || !('header' in m)) throw new Error('the readings preparation sent no header');
    return m.header;
  }

  /** The array literals of each statement, in order. */
  async *chunks(): AsyncGenerator<string[]> {
    for (let m = await this.next(); m; m = await this.next()) {
      if ('literals' in m) yield m.literals;
    }
  }

  /** The audit hash of all readings, once every chunk was taken. */
  async sha256(): Promise<string> {
    while (await this.next());
    return this.finished!.sha256;
  }

  stop(): void {
    this.abort.abort(new Error('the readings were not stored'));
  }
}

/**
 * The readings route's body reader (after the role check): the body is read as it arrives by
 * readings-prepare.ts — in a worker thread when it is large, so that the event loop stays free for
 * other requests — and res.locals.readings holds the ReadingsFeed the route stores from.
 */
export function readingsBody(): RequestHandler {
  return (req, res, next) => {
    try {
      const maxBytes = readingsMaxMb() * 1024 * 1024;
      const declared = Number(req.headers['content-length']);
      if (declared > maxBytes) throw tooLarge();
      const charset = /charset=([^;\s]+)/i.exec(String(req.headers['content-type'] ?? ''))?.[1]?.toLowerCase();
      if (charset && charset !== 'utf-8' && charset !== 'utf8') throw new HttpProblem(415, 'Unsupported charset', `The body's charset "${charset}" is not UTF-8, the only one JSON bodies may use.`);
      // As express.json: a body that is not declared JSON is not read (the route then asks for one).
      const input = req.is('application/json') ? bodyBytes(req, maxBytes) : emptyBody();
      const identity = !req.headers['content-encoding'] || req.headers['content-encoding'] === 'identity';
      const small = Number.isFinite(declared) && declared < OFF_THREAD_FROM_BYTES && identity;
      res.locals['readings'] = new ReadingsFeed((emit, signal) => (small
        ? prepareReadings(input, emit)
        : runOffThread<{ sha256: string }>(join(__dirname, 'readings-prepare.ts'), 'prepareReadings', [], {
          input, signal, onEmit: (m, ack) => emit(m as PreparedMessage, ack),
        })));
      next();
    } catch (err) {
      next(err);
    }
  };
}

// eslint-disable-next-line require-yield
async function* emptyBody(): AsyncGenerator<Uint8Array> {
  return;
}
