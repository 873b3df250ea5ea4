import { ChangeDetectionStrategy, Component, ElementRef, computed, inject, input } from '@angular/core';
import type { ChartData, ChartOptions } from 'chart.js';
import { BaseChartDirective } from 'ng2-charts';

import { RUN_CHARTS, themeColor } from './run-charts';
import { powerAxisRange } from './time-axes';

/** Temperature and heater power over time, on two axes. */
@Component({
  selector: 'qw-time-charts',
  imports: [BaseChartDirective],
  providers: [RUN_CHARTS],
  template: `
    <div class="chart">
      <canvas baseChart type="line" [data]="data()" [options]="options()" role="img" [attr.aria-label]="summary()"></canvas>
    </div>
  `,
  styles: `.chart { position: relative; height: 16rem; }`,
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

  private readonly colors = {
    temperature: themeColor(this.host, '--mat-sys-primary', 'rgb(40, 90, 160)'),
    power: themeColor(this.host, '--mat-sys-tertiary', 'rgb(120, 80, 150)'),
    grid: themeColor(this.host, '--mat-sys-outline-variant', 'rgb(200, 200, 200)'),
    text: themeColor(this.host, '--mat-sys-on-surface', 'rgb(20, 20, 20)'),
  };

  protected readonly summary = computed(() => {
    const parts = [this.temperature() ? 'temperature in K' : '', this.power() ? 'heater power in W' : ''].filter(Boolean);
    return `Chart of ${parts.join(' and ')} against time in s, ${this.time().length} readings`;
  });

  protected readonly data = computed((): ChartData<'line', { x: number; y: number }[]> => {
    const t = this.time();
    const series = (values: readonly number[]) => values.map((y, i) => ({ x: t[i], y }));
    const temperature = this.temperature();
    const power = this.power();
    return {
      datasets: [
        ...(temperature
          ? [{ label: 'Temperature (K)', data: series(temperature), yAxisID: 'y', borderColor: this.colors.temperature, borderWidth: 2, pointRadius: 0 }]
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
        x: { type: 'linear', title: { display: true, text: 'Time (s)', color: this.colors.text }, grid: { color: this.colors.grid }, ticks: { color: this.colors.text } },
        y: axis('Temperature (K)', 'left', this.temperature() !== null),
        // From 0 W to just above the heater's highest power: its level reads, not the noise on it.
        y1: { ...axis('Heater power (W)', 'right', power !== null), ...powerAxisRange(power ?? []) },
      },
      plugins: { legend: { labels: { color: this.colors.text } } },
    };
  });
}
