import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import type { ChartData, ChartOptions } from 'chart.js';

import { chartColors, lineChartOptions, linearAxis, withAlpha } from '../../../shared/charts/chart-theme';
import { ChartPoint as Point, LineChart } from '../../../shared/charts/line-chart';
import type { TemperatureRise } from '../calorimetry.models';
import { riseOverlay, riseOverlayPlugin } from './rise-overlay';
import { powerAxisRange } from './time-axes';

/**
 * Temperature and heater power over time, on two axes. For a calorimetric run the same chart shades the fore-,
 * main and after-period, draws the fitted drift lines extended to Dickinson's time b and marks the corrected rise.
 */
@Component({
  selector: 'qw-time-charts',
  imports: [LineChart],
  template: `<qw-line-chart [data]="data()" [options]="options()" [plugins]="plugins" [summary]="summary()" />`,
  // A narrow screen stacks the legend: more height keeps the plot readable.
  styles: `@media (max-width: 40rem) { qw-line-chart { height: 26rem; } }`,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class TimeCharts {
  /** Time, s. */
  readonly time = input.required<readonly number[]>();
  /** Temperature, K; null when the run has none. */
  readonly temperature = input<readonly number[] | null>(null);
  /** Heater power, W; null when the run is not heated. */
  readonly power = input<readonly number[] | null>(null);
  /** The corrected rise of a calorimetric run; null otherwise. */
  readonly rise = input<TemperatureRise | null>(null);

  private readonly colors = chartColors({
    temperature: ['--mat-sys-primary', 'rgb(40, 90, 160)'],
    power: ['--mat-sys-tertiary', 'rgb(120, 80, 150)'],
    drift: ['--mat-sys-error', 'rgb(186, 26, 26)'],
    marks: ['--mat-sys-outline', 'rgb(120, 120, 120)'],
    surface: ['--mat-sys-surface', 'rgb(255, 255, 255)'],
  });

  private readonly overlay = computed(() => {
    const rise = this.rise();
    return rise && this.temperature() ? riseOverlay(this.time(), rise) : null;
  });

  protected readonly plugins = [
    riseOverlayPlugin(() => this.overlay(), {
      outer: withAlpha(this.colors.marks, 0.08),
      main: withAlpha(this.colors.power, 0.12),
      text: this.colors.text,
      halo: this.colors.surface,
    }),
  ];

  protected readonly summary = computed(() => {
    const parts = [this.temperature() ? 'temperature in K' : '', this.power() ? 'heater power in W' : ''].filter(Boolean);
    const base = `Chart of ${parts.join(' and ')} against time in s, ${this.time().length} readings`;
    const o = this.overlay();
    const rise = this.rise();
    if (!o || !rise) return base;
    const p = rise.periods;
    return `${base}; fore-period to ${p.mainStart.toFixed(0)} s, main period to ${p.mainEnd.toFixed(0)} s, then the after-period; the fitted drift lines are extended to Dickinson's time ${p.dickinsonTime.toFixed(0)} s, where the corrected rise is marked: ${o.label.join(' ')}`;
  });

  protected readonly data = computed((): ChartData<'line', Point[]> => {
    const t = this.time();
    const series = (values: readonly number[]) => values.map((y, i) => ({ x: t[i], y }));
    const temperature = this.temperature();
    const power = this.power();
    const o = this.overlay();
    const line = (label: string, data: Point[], dash: number[]) => ({ label, data, yAxisID: 'y', borderColor: this.colors.drift, borderDash: dash, borderWidth: 2, pointRadius: 0 });
    return {
      datasets: [
        ...(temperature
          ? [{ label: 'Temperature (K)', data: series(temperature), yAxisID: 'y', borderColor: this.colors.temperature, borderWidth: 2, pointRadius: 0 }]
          : []),
        ...(o
          ? [
            line('Fore-drift, fitted and extended', o.foreLine, [6, 3]),
            line('After-drift, fitted and extended', o.afterLine, [2, 3]),
            { ...line('Corrected rise (at Dickinson\'s time)', o.riseSegment, []), borderWidth: 3, pointRadius: 4, pointStyle: 'line' as const, borderColor: this.colors.text, pointBorderColor: this.colors.text },
          ]
          : []),
        ...(power
          ? [{ label: 'Heater power (W)', data: series(power), yAxisID: 'y1', borderColor: this.colors.power, borderDash: [6, 3], borderWidth: 2, pointRadius: 0 }]
          : []),
      ],
    };
  });

  protected readonly options = computed((): ChartOptions<'line'> => {
    const power = this.power();
    const side = (position: 'left' | 'right', shown: boolean) => ({ position, display: shown, grid: { drawOnChartArea: position === 'left' } });
    return lineChartOptions(this.colors, {
      interaction: { mode: 'nearest', intersect: false },
      scales: {
        // With periods shaded, the axis runs exactly from the first to the last reading.
        x: linearAxis('Time (s)', this.colors, this.overlay() ? { min: this.time()[0], max: this.time()[this.time().length - 1] } : {}),
        y: linearAxis('Temperature (K)', this.colors, side('left', this.temperature() !== null)),
        // From 0 W to just above the heater's highest power: its level reads, not the noise on it.
        y1: linearAxis('Heater power (W)', this.colors, { ...side('right', power !== null), ...powerAxisRange(power ?? []) }),
      },
      plugins: { legend: { labels: { boxWidth: 24 } } },
    });
  });
}
