import { ChangeDetectionStrategy, Component, ElementRef, computed, inject, input } from '@angular/core';
import type { ChartData, ChartOptions } from 'chart.js';
import { BaseChartDirective } from 'ng2-charts';

import type { TemperatureRise } from '../calorimetry.models';
import { RUN_CHARTS, themeColor } from './run-charts';

type Point = { x: number; y: number };

/** The temperature record with its three periods, the fitted fore- and after-drift lines and the main period marked. */
@Component({
  selector: 'qw-rise-chart',
  imports: [BaseChartDirective],
  providers: [RUN_CHARTS],
  template: `
    <div class="chart">
      <canvas baseChart type="line" [data]="data()" [options]="options()" role="img" [attr.aria-label]="summary()"></canvas>
    </div>
  `,
  styles: `.chart { position: relative; height: 18rem; }`,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class RiseChart {
  private readonly host = inject<ElementRef<HTMLElement>>(ElementRef).nativeElement;

  /** Time, s, and temperature, K. */
  readonly time = input.required<readonly number[]>();
  readonly temperature = input.required<readonly number[]>();
  readonly rise = input.required<TemperatureRise>();

  private readonly colors = {
    temperature: themeColor(this.host, '--mat-sys-primary', 'rgb(40, 90, 160)'),
    drift: themeColor(this.host, '--mat-sys-tertiary', 'rgb(181, 101, 58)'),
    marks: themeColor(this.host, '--mat-sys-outline', 'rgb(120, 120, 120)'),
    grid: themeColor(this.host, '--mat-sys-outline-variant', 'rgb(200, 200, 200)'),
    text: themeColor(this.host, '--mat-sys-on-surface', 'rgb(20, 20, 20)'),
  };

  protected readonly summary = computed(() => {
    const p = this.rise().periods;
    return `Temperature against time with the fore-period up to ${p.mainStart.toFixed(0)} s, the main period to ${p.mainEnd.toFixed(0)} s and the after-period, and the fitted drift lines`;
  });

  protected readonly data = computed((): ChartData<'line', Point[]> => {
    const t = this.time(), T = this.temperature(), r = this.rise();
    const { fore, after } = r.drift;
    const t0 = t[0], tN = t[t.length - 1];
    const line = (d: TemperatureRise['drift']['fore'], a: number, b: number): Point[] => [a, b].map((x) => ({ x, y: d.meanTemperature + d.rate * (x - d.meanTime) }));
    const lo = Math.min(...T), hi = Math.max(...T);
    const vertical = (x: number): Point[] => [{ x, y: lo }, { x, y: hi }];
    return {
      datasets: [
        { label: 'Temperature (K)', data: T.map((y, i) => ({ x: t[i], y })), borderColor: this.colors.temperature, borderWidth: 2, pointRadius: 0 },
        { label: 'Fore-drift, extended', data: line(fore, t0, r.periods.mainEnd), borderColor: this.colors.drift, borderDash: [6, 3], borderWidth: 2, pointRadius: 0 },
        { label: 'After-drift, extended', data: line(after, r.periods.mainStart, tN), borderColor: this.colors.drift, borderDash: [2, 3], borderWidth: 2, pointRadius: 0 },
        { label: 'Main period', data: vertical(r.periods.mainStart), borderColor: this.colors.marks, borderWidth: 1, pointRadius: 0 },
        { label: 'Main period end', data: vertical(r.periods.mainEnd), borderColor: this.colors.marks, borderWidth: 1, pointRadius: 0 },
      ],
    };
  });

  protected readonly options = computed((): ChartOptions<'line'> => ({
    responsive: true,
    maintainAspectRatio: false,
    animation: false,
    parsing: false,
    scales: {
      x: { type: 'linear', title: { display: true, text: 't / s', color: this.colors.text }, grid: { color: this.colors.grid }, ticks: { color: this.colors.text } },
      y: { type: 'linear', title: { display: true, text: 'T / K', color: this.colors.text }, grid: { color: this.colors.grid }, ticks: { color: this.colors.text } },
    },
    plugins: { legend: { labels: { color: this.colors.text, filter: (item) => item.text !== 'Main period end' } } },
  }));
}
