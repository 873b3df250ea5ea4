import { ChangeDetectionStrategy, Component, input } from '@angular/core';
import type { ChartData, ChartOptions, Plugin } from 'chart.js';
import { Filler, Legend, LineController, LineElement, LinearScale, PointElement, Tooltip } from 'chart.js';
import { BaseChartDirective, provideCharts } from 'ng2-charts';

/** A point of a line chart in the axes' own units (parsing is off). */
export type ChartPoint = { x: number; y: number };

/**
 * The canvas every Qwell chart draws on: a chart.js line chart on linear axes, filling its box (18rem high unless
 * the chart's own styles say otherwise), read out to screen readers by `summary`. Only the chart.js parts
 * registered here are bundled, and only with the lazy pages that draw a chart.
 */
@Component({
  selector: 'qw-line-chart',
  imports: [BaseChartDirective],
  providers: [provideCharts({ registerables: [LineController, LineElement, PointElement, LinearScale, Filler, Legend, Tooltip] })],
  template: `
    <canvas baseChart type="line" [data]="data()" [options]="options()" [plugins]="plugins()" role="img" [attr.aria-label]="summary()"></canvas>
  `,
  // The canvas fills this box (chart.js sizes it to its parent); a chart's own styles set another height on qw-line-chart.
  styles: `:host { display: block; position: relative; height: 18rem; }`,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class LineChart {
  readonly data = input.required<ChartData<'line', ChartPoint[]>>();
  readonly options = input.required<ChartOptions<'line'>>();
  /** What the chart shows, in words: the canvas's accessible name. */
  readonly summary = input.required<string>();
  /** Plugins of this chart alone (read when the chart is made). */
  readonly plugins = input<Plugin<'line'>[]>([]);
}
