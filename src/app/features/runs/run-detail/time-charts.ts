import { ChangeDetectionStrategy, Component, ElementRef, computed, inject, input } from '@angular/core';
import type { ChartData, ChartOptions } from 'chart.js';
import { BaseChartDirective } from 'ng2-charts';

import type { TemperatureRise } from '../calorimetry.models';
import { riseOverlay, riseOverlayPlugin } from './rise-overlay';
import { RUN_CHARTS, themeColor, withAlpha } from './run-charts';
import { powerAxisRange } from './time-axes';

type Point = { x: number; y: number };

/**
 * Temperature and heater power over time, on two axes. For a calorimetric run the same chart shades the fore-,
 * main and after-period, draws the fitted drift lines extended to Dickinson's time b and marks the corrected rise.
 */
@Component({
  selector: 'qw-time-charts',
  imports: [BaseChartDirective],
  providers: [RUN_CHARTS],
  template: `
    <div class="chart">
      <canvas baseChart type="line" [data]="data()" [options]="options()" [plugins]="plugins" role="img" [attr.aria-label]="summary()"></canvas>
    </div>
  `,
  // A narrow screen stacks the legend: more height keeps the plot readable.
  styles: `.chart { position: relative; height: 18rem; } @media (max-width: 40rem) { .chart { height: 26rem; } }`,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class TimeCharts {
  private readonly host = inject<ElementRef<HTMLElement>>(ElementRef).nativeElement;

  /** Time, s. */
  readonly time = input.required<readonly number[]>();
  /** Temperature, K; null when the run has none. */
  readonly temperature = input<readonly number[] | null>(null);
  /** Heater power, W; null when the run is not heated. */
  readonly power = input<readonly number[] | null>(null);
  /** The corrected rise of a calorimetric run; null otherwise. */
  readonly rise = input<TemperatureRise | null>(null);

  private readonly colors = {
    temperature: themeColor(this.host, '--mat-sys-primary', 'rgb(40, 90, 160)'),
    power: themeColor(this.host, '--mat-sys-tertiary', 'rgb(120, 80, 150)'),
    drift: themeColor(this.host, '--mat-sys-error', 'rgb(186, 26, 26)'),
    marks: themeColor(this.host, '--mat-sys-outline', 'rgb(120, 120, 120)'),
    surface: themeColor(this.host, '--mat-sys-surface', 'rgb(255, 255, 255)'),
    grid: themeColor(this.host, '--mat-sys-outline-variant', 'rgb(200, 200, 200)'),
    text: themeColor(this.host, '--mat-sys-on-surface', 'rgb(20, 20, 20)'),
  };

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
    const axis = (text: string, position: 'left' | 'right', display: boolean) => ({
      type: 'linear' as const,
      position,
      display,
      title: { display: true, text, color: this.colors.text },
      grid: { color: this.colors.grid, drawOnChartArea: position === 'left' },
      ticks: { color: this.colors.text },
    });
    return {
      responsive: true,
      maintainAspectRatio: false,
      animation: false,
      parsing: false,
      interaction: { mode: 'nearest', intersect: false },
      scales: {
        x: {
          type: 'linear', title: { display: true, text: 'Time (s)', color: this.colors.text }, grid: { color: this.colors.grid }, ticks: { color: this.colors.text },
          // With periods shaded, the axis runs exactly from the first to the last reading.
          ...(this.overlay() ? { min: this.time()[0], max: this.time()[this.time().length - 1] } : {}),
        },
        y: axis('Temperature (K)', 'left', this.temperature() !== null),
        // From 0 W to just above the heater's highest power: its level reads, not the noise on it.
        y1: { ...axis('Heater power (W)', 'right', power !== null), ...powerAxisRange(power ?? []) },
      },
      plugins: { legend: { labels: { color: this.colors.text, boxWidth: 24 } } },
    };
  });
}
