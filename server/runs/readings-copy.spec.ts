import { sha256Canonical } from '../engine/canonical';
import type { ReadingRow } from './run-document-mapper';
import { sha256ReadingRows } from './readings-copy';

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
