import { TestBed } from '@angular/core/testing';

import type { BalanceResult } from '../run-detail.models';
import { BalanceCard } from './balance-card';

const base = {
  work: { measured: 60.49089, u: 0.1288, U: 0.2576, model: 60.569, modelFormula: '', gap: -0.078 },
  heat: { electrical: 0, leak: 0, wall: 0, total: 0, u: 0, U: 0 },
  internalEnergy: { value: -60.496888, u: 0.15174, U: 0.30347, method: 'n·∫Cv dT' },
  residual: { r: -0.005998, u: 0.19903, U: 0.39806, k: 2 },
  correlations: { W_Q: 0, W_dU: 0, Q_dU: 0 },
  En: 0.01507,
  verdict: 'closes',
  indeterminateLimit: 12.099,
  budget: [],
  polytropicFit: null,
  flags: [],
  hints: [],
};

const monteCarlo = {
  draws: 1000, mean: -0.006, sd: 0.2, low: -0.4, high: 0.39, coverage: 0.95, agreesWithLinear: true, note: 'Agrees.',
};

function render(result: unknown): HTMLElement {
  const fixture = TestBed.createComponent(BalanceCard);
  fixture.componentRef.setInput('result', result as BalanceResult);
  fixture.detectChanges();
  return fixture.nativeElement as HTMLElement;
}

describe('BalanceCard Monte Carlo section', () => {
  it('draws the histogram of r when the stored result has one, labelled with the draws and the interval', () => {
    const histogram = { start: -0.7, width: 0.035, counts: Array.from({ length: 40 }, (_, i) => 25 - Math.abs(20 - i)), outside: 1 };
    const root = render({ ...base, monteCarlo: { ...monteCarlo, histogram } });
    const canvas = root.querySelector('qw-mc-histogram canvas');
    const total = histogram.counts.reduce((a, b) => a + b, 0) + histogram.outside;
    expect(canvas?.getAttribute('aria-label')).toBe(`Histogram of ${total} Monte Carlo draws of r in J; 95 % interval from -0.400 to 0.390 J`);
  });

  it('shows the interval without a chart for a result stored before histograms were kept', () => {
    const root = render({ ...base, monteCarlo });
    expect(root.querySelector('qw-mc-histogram')).toBeNull();
    expect(root.textContent).toContain('1,000 draws');
  });
});

describe('BalanceCard certificate corrections', () => {
  it('says in the lab\'s words and units which readings the check corrected, and by which certificate', () => {
    const corrections = [{ reading: 'temperature', instrument: 'TC-9', instrumentName: 'Pt100 probe', certificate: 'HIAT-CAL-2310', gain: 1.0004, offset: -0.05, unit: 'degC' }];
    const root = render({ ...base, monteCarlo, corrections });
    const items = [...root.querySelectorAll('.corrections li')].map((li) => li.textContent?.trim());
    expect(items).toEqual(['Temperature readings corrected by certificate HIAT-CAL-2310 of TC-9: × 1.0004 − 0.05 °C.']);
    expect(root.querySelector('.corrections')?.textContent).toContain('reading × gain + offset');
  });

  it('shows nothing new for a run with no corrections, or a result stored before engine 2.3', () => {
    expect(render({ ...base, monteCarlo, corrections: [] }).querySelector('.corrections')).toBeNull();
    expect(render({ ...base, monteCarlo }).querySelector('.corrections')).toBeNull();
  });
});
