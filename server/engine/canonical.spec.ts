import { createHash } from 'node:crypto';
import { canonicalJson, sha256Canonical } from './canonical';

describe('canonical JSON and its SHA-256', () => {
  it('sorts keys at every level and drops whitespace', () => {
    expect(canonicalJson({ b: 1, a: { d: [3, { z: 1, y: 2 }], c: 'x' } })).toBe('{"a":{"c":"x","d":[3,{"y":2,"z":1}]},"b":1}');
  });
  it('key order does not change the hash; a changed value does', () => {
    expect(sha256Canonical({ a: 1, b: [1, 2] })).toBe(sha256Canonical({ b: [1, 2], a: 1 }));
    expect(sha256Canonical({ a: 1, b: [1, 2] })).not.toBe(sha256Canonical({ a: 1, b: [1, 2.0000001] }));
  });
  it('the streamed hash equals SHA-256 of the whole canonical string, also past the chunk size', () => {
    // FIPS 180-4 SHA-256 as implemented by node:crypto; the streaming must not change the digest
    const big = { values: Array.from({ length: 30000 }, (_, i) => i / 7) };
    expect(sha256Canonical(big)).toBe(createHash('sha256').update(canonicalJson(big)).digest('hex'));
    // SHA-256("{}") from FIPS 180-4 applied to the two bytes "{}" (common practice check value)
    expect(sha256Canonical({})).toBe(createHash('sha256').update('{}').digest('hex'));
  });
  it('refuses NaN', () => {
    expect(() => canonicalJson({ a: NaN })).toThrow(/NaN/);
  });
});
