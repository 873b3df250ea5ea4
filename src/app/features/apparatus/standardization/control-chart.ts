import { ChangeDetectionStrategy, Component, ElementRef, computed, inject, input } from '@angular/core';
import type { ChartData, ChartOptions } from 'chart.js';
import { Legend, LineController, LineElement, LinearScale, PointElement, Tooltip } from 'chart.js';
import { BaseChartDirective, provideCharts } from 'ng2-charts';

import { themeColor } from '../../runs/run-detail/run-charts';
import type { SeriesRun, StandardizationOverview } from './standardization.models';

type Point = { x: number; y: number };

/** Individuals control chart of the energy equivalent: one point per run, centre line and 3σ limits. */
@Component({
  selector: 'qw-control-chart',
  imports: [BaseChartDirective],
  providers: [provideCharts({ registerables: [LineController, LineElement, PointElement, LinearScale, Legend, Tooltip] })],
  template: `
    <div class="chart">
      <canvas baseChart type="line" [data]="data()" [options]="options()" role="img" [attr.aria-label]="summary()"></canvas>
    </div>
  `,
  styles: `.chart { position: relative; height: 18rem; }`,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ControlChart {
  private readonly host = inject<ElementRef<HTMLElement>>(ElementRef).nativeElement;

  readonly series = input.required<SeriesRun[]>();
  readonly chart = input.required<NonNullable<StandardizationOverview['chart']>>();

  private readonly colors = {
    points: themeColor(this.host, '--mat-sys-primary', 'rgb(14, 92, 99)'),
    out: themeColor(this.host, '--mat-sys-error', 'rgb(186, 26, 26)'),
    limits: themeColor(this.host, '--mat-sys-tertiary', 'rgb(181, 101, 58)'),
    grid: themeColor(this.host, '--mat-sys-outline-variant', 'rgb(200, 200, 200)'),
    text: themeColor(this.host, '--mat-sys-on-surface', 'rgb(20, 20, 20)'),
  };

  protected readonly summary = computed(() => {
    const c = this.chart();
    const out = this.series().filter((s) => s.outOfControl).map((s) => s.code);
    return `Control chart of the energy equivalent of ${this.series().length} runs: centre ${c.centre.toFixed(1)} J/K, limits ${c.lower.toFixed(1)} to ${c.upper.toFixed(1)} J/K; ${out.length ? `out of control: ${out.join(', ')}` : 'no run out of control'}`;
  });

  protected readonly data = computed((): ChartData<'line', Point[]> => {
    const s = this.series();
    const c = this.chart();
    const n = s.length;
    const line = (y: number): Point[] => [{ x: 0.5, y }, { x: n + 0.5, y }];
    return {
      datasets: [
        {
          label: 'ε per run (J/K)', data: s.map((r, i) => ({ x: i + 1, y: r.energyEquivalent.value })), borderColor: this.colors.points, borderWidth: 1,
          pointBackgroundColor: s.map((r) => (r.outOfControl ? this.colors.out : this.colors.points)),
          pointBorderColor: s.map((r) => (r.outOfControl ? this.colors.out : this.colors.points)),
          pointRadius: s.map((r) => (r.outOfControl ? 6 : 4)), pointStyle: s.map((r) => (r.outOfControl ? 'crossRot' : 'circle')),
        },
        { label: 'centre line', data: line(c.centre), borderColor: this.colors.text, borderWidth: 1, pointRadius: 0 },
        { label: 'control limits (±3σ)', data: line(c.upper), borderColor: this.colors.limits, borderDash: [6, 3], borderWidth: 2, pointRadius: 0 },
        { label: 'lower limit', data: line(c.lower), borderColor: this.colors.limits, borderDash: [6, 3], borderWidth: 2, pointRadius: 0 },
      ],
    };
  });

  protected readonly options = computed((): ChartOptions<'line'> => ({
    responsive: true,
    maintainAspectRatio: false,
    animation: false,
    parsing: false,
    scales: {
      x: {
        type: 'linear', min: 0.5, max: this.series().length + 0.5,
        title: { display: true, text: 'run, in date order', color: this.colors.text },
        ticks: { stepSize: 1, color: this.colors.text, callback: (v) => this.series()[Number(v) - 1]?.code ?? '' },
        grid: { color: this.colors.grid },
      },
      y: { type: 'linear', title: { display: true, text: 'energy equivalent ε / (J/K)', color: this.colors.text }, grid: { color: this.colors.grid }, ticks: { color: this.colors.text } },
    },
    plugins: {
      legend: { labels: { color: this.colors.text, filter: (item) => item.text !== 'lower limit' } },
      tooltip: { callbacks: { label: (ctx) => (ctx.datasetIndex === 0 ? `${this.series()[ctx.dataIndex]?.code}: ${ctx.parsed.y?.toFixed(1)} J/K` : `${ctx.dataset.label}: ${ctx.parsed.y?.toFixed(1)} J/K`) } },
    },
  }));
}
