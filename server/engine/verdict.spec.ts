import { EN_EPSILON, normalizedError, normalizedErrorPair, verdictOf } from './verdict';

describe('normalized error E_n (REFERENCES §7)', () => {
  it('synthetic examples: 100.3 vs 100.0 with U 0.4/0.3 gives 0.6; 99.2 gives |−1.6|', () => {
    // ISO 13528:2015 §9.7 formula (clause from memory), values computed in REFERENCES §7
    expect(normalizedErrorPair(100.3, 100, 0.4, 0.3)).toBeCloseTo(0.6, 12);
    expect(normalizedErrorPair(99.2, 100, 0.4, 0.3)).toBeCloseTo(1.6, 12);
  });
  it('the float64 boundary case 10.05 vs 10.00 with U 0.04/0.03 is 1.0000000000000142 and still closes', () => {
    // REFERENCES §7 (computed): exactly 1 in decimal arithmetic; ISO/IEC 17043:2010 Annex B: |En| ≤ 1 satisfactory
    const En = normalizedErrorPair(10.05, 10, 0.04, 0.03);
    expect(En).toBe(1.0000000000000142);
    expect(verdictOf(10.05 - 10, Math.sqrt(0.04 ** 2 + 0.03 ** 2), 1, 1).verdict).toBe('closes');
  });
  it('just beyond the epsilon breaks', () => {
    expect(verdictOf(1 + 10 * EN_EPSILON, 1, 100, 0.2).verdict).toBe('breaks');
    expect(verdictOf(1, 1, 100, 0.2).verdict).toBe('closes');
    expect(verdictOf(-1.6, 1, 100, 0.2).verdict).toBe('breaks');
  });
  it('indeterminate when U(r) exceeds the fraction of the largest energy term, whatever En', () => {
    expect(verdictOf(0, 25, 100, 0.2)).toEqual({ En: 0, verdict: 'indeterminate', limit: 20 });
    expect(verdictOf(0, 19, 100, 0.2).verdict).toBe('closes');
  });
  it('zero uncertainty: En is 0 for r = 0 and infinite otherwise', () => {
    expect(normalizedError(0, 0)).toBe(0);
    expect(normalizedError(1, 0)).toBe(Infinity);
  });
});
