// Canonical JSON (object keys sorted by code unit, no whitespace, JSON.stringify for scalars) and its SHA-256.
// Streamed into the hash in chunks so a run of 10⁶ readings never becomes one giant string.
import { createHash } from 'node:crypto';

type Sink = (chunk: string) => void;


function write(value: unknown, sink: Sink): void {
  if (value === null || typeof value !== 'object') {
    if (typeof value === 'number' && !Number.isFinite(value)) throw new Error('canonical JSON has no NaN or Infinity');
    sink(value === undefined ? 'null' : JSON.stringify(Object.is(value, -0) ? 0 : value));
    return;
  }
  if (Array.isArray(value)) {
    // Fast path for readings: for an array of finite numbers and strings JSON.stringify already writes the
    // canonical form. "null" (NaN, Infinity, null, undefined) or a nested object/array falls back to the
    // element-wise writer, which refuses NaN and sorts nested keys.
    const s = JSON.stringify(value);
    if (!s.includes('null') && !s.includes('{') && s.indexOf('[', 1) === -1) {
      sink(s);
      return;
    }
  }
  if (Array.isArray(value) || ArrayBuffer.isView(value)) {
    const arr = value as ArrayLike<unknown>;
    sink('[');
    for (let i = 0; i < arr.length; i++) {
      if (i > 0) sink(',');
      write(arr[i], sink);
    }
    sink(']');
    return;
  }
  const obj = value as Record<string, unknown>;
  const keys = Object.keys(obj).filter((k) => obj[k] !== undefined).sort();
  sink('{');
  keys.forEach((k, i) => {
    if (i > 0) sink(',');
    sink(JSON.stringify(k));
    sink(':');
    write(obj[k], sink);
  });
  sink('}');
}

export function canonicalJson(value: unknown): string {
  const parts: string[] = [];
  write(value, (c) => parts.push(c));
  return parts.join('');
}

export function sha256Canonical(value: unknown): string {
  const hash = createHash('sha256');
  let buffer = '';
  write(value, (c) => {
    if (c.length > 65536) {
      // Large pieces (a channel's readings) go straight to the hash instead of through string concatenation.
      hash.update(buffer, 'utf8');
      buffer = '';
      hash.update(c, 'utf8');
      return;
    }
    buffer += c;
    if (buffer.length > 65536) {
      hash.update(buffer, 'utf8');
      buffer = '';
    }
  });
  hash.update(buffer, 'utf8');
  return hash.digest('hex');
}
