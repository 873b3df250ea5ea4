import { mean, sampleStandardDeviation } from 'simple-statistics';
import { ASTM_D240_MIN_DAYS, ASTM_D240_MIN_RUNS, D2, individualsLimits, runRuleBreaks, summariseSeries } from './control-chart';

const rule = { minRuns: ASTM_D240_MIN_RUNS, minDays: ASTM_D240_MIN_DAYS, maxRsd: 0.005 };
const values = [10_571.2, 10_574.9, 10_569.8, 10_573.1, 10_576.4, 10_570.6, 10_572.3, 10_575.0];
const dates = ['2026-03-02', '2026-03-02', '2026-03-03', '2026-03-03', '2026-03-04', '2026-03-04', '2026-03-05', '2026-03-05'];

describe('individuals control chart (ISO 7870-2) checked against simple-statistics', () => {
  it('puts the centre at the mean and the limits at ±3·MR̄/d₂', () => {
    const L = individualsLimits(values)!;
    const movingRanges = values.slice(1).map((v, i) => Math.abs(v - values[i]));
    // simple-statistics 7.12.1 as the reference library for the mean and the average moving range
    expect(L.centre).toBeCloseTo(mean(values), 9);
    expect(L.sigma).toBeCloseTo(mean(movingRanges) / 1.128, 9); // d₂ = 1.128 for n = 2 (ISO 7870-2 table, from memory)
    expect(D2).toBe(1.128);
    expect(L.upper).toBeCloseTo(mean(values) + (3 * mean(movingRanges)) / 1.128, 9);
    expect(L.lower).toBeCloseTo(mean(values) - (3 * mean(movingRanges)) / 1.128, 9);
  });

  it('summarises the series: sample standard deviation and the standard uncertainty of the mean', () => {
    const s = summariseSeries(values.map((value, i) => ({ value, date: dates[i] })), rule);
    expect(s.mean).toBeCloseTo(mean(values), 9);
    expect(s.sd).toBeCloseTo(sampleStandardDeviation(values), 9); // simple-statistics
    expect(s.uMean).toBeCloseTo(sampleStandardDeviation(values) / Math.sqrt(8), 9); // s/√n (GUM 4.2.3)
    expect(s.days).toBe(4);
    expect(s.acceptance).toEqual({ ok: true, reasons: [] });
  });
});

describe('run rules (the ISO 7870-2 tests for special causes, from memory)', () => {
  const L = { centre: 0, sigma: 1, lower: -3, upper: 3 };
  it('test 1: a point beyond 3σ', () => {
    expect(runRuleBreaks([0.1, -0.2, 3.4, 0], L).map((b) => b?.test ?? null)).toEqual([null, null, 1, null]);
  });
  it('test 2: nine in a row on one side', () => {
    const b = runRuleBreaks([0.5, 0.2, 0.3, 0.4, 0.1, 0.6, 0.3, 0.2, 0.4], L);
    expect(b.slice(0, 8).every((x) => x === null)).toBe(true);
    expect(b[8]).toEqual({ test: 2, rule: 'nine points in a row on one side of the centre line' });
  });
  it('test 3: six steadily increasing', () => {
    expect(runRuleBreaks([-0.9, -0.5, -0.2, 0.1, 0.4, 0.8], L)[5]?.test).toBe(3);
  });
  it('test 5: two of three beyond 2σ on one side', () => {
    expect(runRuleBreaks([2.5, 0.1, 2.2], L)[2]?.test).toBe(5);
    expect(runRuleBreaks([2.5, 0.1, -2.2], L)[2]).toBeNull();
  });
  it('test 6: four of five beyond 1σ on one side', () => {
    expect(runRuleBreaks([1.5, 1.2, 0.3, 1.8, 1.1], L)[4]?.test).toBe(6);
  });
});

describe('acceptance rule (ASTM D240 §8.1: not less than six tests spread over not less than three days)', () => {
  const pts = (n: number, days: string[]) => Array.from({ length: n }, (_, i) => ({ value: 10_000 + (i % 2), date: days[i % days.length] }));
  it('accepts six runs over three days', () => {
    expect(summariseSeries(pts(6, ['2026-01-05', '2026-01-06', '2026-01-07']), rule).acceptance.ok).toBe(true);
  });
  it('refuses five runs, saying how many the rule asks for', () => {
    const s = summariseSeries(pts(5, ['2026-01-05', '2026-01-06', '2026-01-07']), rule);
    expect(s.acceptance.ok).toBe(false);
    expect(s.acceptance.reasons).toEqual(['5 run(s); the lab\'s rule asks for at least 6']);
  });
  it('refuses six runs over two days', () => {
    const s = summariseSeries(pts(6, ['2026-01-05', '2026-01-06']), rule);
    expect(s.acceptance.reasons).toEqual(['runs on 2 day(s); the lab\'s rule asks for at least 3']);
  });
  it('refuses a spread above the lab\'s RSD limit', () => {
    const s = summariseSeries([1000, 1100, 1000, 1100, 1000, 1100].map((value, i) => ({ value, date: `2026-01-0${1 + (i % 3)}` })), rule);
    // s = √(6·50²/5) = 54.772, mean 1050 ⇒ 5.216 % (hand computation)
    expect(s.acceptance.reasons[0]).toMatch(/relative standard deviation 5\.216 % is above the lab's limit of 0\.500 %/);
  });
});
