import { mean } from 'simple-statistics';
import { ASTM_D240_MIN_DAYS, ASTM_D240_MIN_RUNS, individualsLimits } from './control-chart';
import { segmentByChanges } from './control-chart-segments';

const rule = { minRuns: ASTM_D240_MIN_RUNS, minDays: ASTM_D240_MIN_DAYS, maxRsd: 0.005 };
// Invented demo series: eight runs near 4850 J/K, a heater replaced on 2026-03-10, then six runs near 4905 J/K.
const before = [4851.2, 4849.6, 4852.8, 4850.1, 4848.9, 4851.7, 4850.4, 4849.8];
const after = [4904.1, 4906.3, 4903.8, 4905.5, 4904.9, 4906.0];
const points = [
  ...before.map((value, i) => ({ value, date: `2026-03-0${1 + Math.floor(i / 2)}` })),
  ...after.map((value, i) => ({ value, date: `2026-03-${11 + Math.floor(i / 2)}` })),
];
const repair = { date: '2026-03-10', description: 'immersion heater replaced' };

describe('the control chart restarts after a recorded apparatus change (ASTM D240 §8.1.1, ISO 7870-2)', () => {
  it('computes the current centre line and limits from the runs after the change alone', () => {
    const [previous, current] = segmentByChanges(points, [repair], rule);
    expect(current).toMatchObject({ change: repair, start: 8, end: 14, current: true });
    // Centre = mean of the six later runs, σ = MR̄/1.128 of those runs only (ISO 7870-2 individuals chart; simple-statistics for the mean)
    expect(current.summary.chart!.centre).toBeCloseTo(mean(after), 9);
    expect(current.summary.chart).toEqual(individualsLimits(after));
    expect(current.summary.n).toBe(6);
    expect(current.summary.days).toBe(3);
    // Six runs over three days and no rule broken: the new segment alone meets the ASTM D240 §8.1 acceptance rule
    expect(current.summary.acceptance.ok).toBe(true);
    expect(previous).toMatchObject({ change: null, start: 0, end: 8, current: false });
    expect(previous.summary.chart!.centre).toBeCloseTo(mean(before), 9);
  });

  it('does not flag the shift itself: each segment is judged against its own limits', () => {
    const segments = segmentByChanges(points, [repair], rule);
    expect(segments.flatMap((s) => s.summary.breaks).every((b) => b === null)).toBe(true);
    // Without the change, one chart over both would put the later runs far outside the limits (test 1).
    const [single] = segmentByChanges(points, [], rule);
    expect(single.summary.breaks.slice(8).some((b) => b?.test === 1 || b?.test === 5 || b?.test === 6)).toBe(true);
  });

  it('puts a run of the change\'s day before it when it was entered before the change was recorded, and keeps an empty current segment right after a change', () => {
    const sameDay = segmentByChanges(points, [{ date: '2026-03-04', description: 'stirrer replaced' }], rule);
    expect(sameDay.map((s) => [s.start, s.end])).toEqual([[0, 6], [6, 14]]);
    // Runs of 2026-03-04 entered at 09:00 and 15:00; the stirrer replaced and recorded at 12:00.
    const entered = points.map((p, i) => ({ ...p, at: i === 7 ? '2026-03-04T15:00:00Z' : `${p.date}T09:00:00Z` }));
    const noon = segmentByChanges(entered, [{ date: '2026-03-04', description: 'stirrer replaced', recordedAt: '2026-03-04T12:00:00Z' }], rule);
    expect(noon.map((s) => [s.start, s.end])).toEqual([[0, 7], [7, 14]]);
    const fresh = segmentByChanges(points, [{ date: '2026-03-20', description: 'thermometer replaced' }, repair], rule);
    expect(fresh.map((s) => [s.start, s.end, s.current])).toEqual([[0, 8, false], [8, 14, false], [14, 14, true]]);
    expect(fresh[2].summary.chart).toBeNull();
    expect(fresh[2].summary.acceptance.reasons[0]).toBe('0 run(s); the lab\'s rule asks for at least 6');
  });
});
