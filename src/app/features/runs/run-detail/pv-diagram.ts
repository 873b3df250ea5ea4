import { ChangeDetectionStrategy, Component, computed, input, signal } from '@angular/core';
import { MatCheckboxModule } from '@angular/material/checkbox';
import type { ChartData, ChartOptions, ScriptableContext } from 'chart.js';

import { chartColors, lineChartOptions, linearAxis, withAlpha } from '../../../shared/charts/chart-theme';
import { LineChart } from '../../../shared/charts/line-chart';
import { GammaChoice, PvPoint, arrowStep, claimedCurve, idealCurve, measuredPath } from './pv-curves';

type Layer = 'path' | 'arrows' | 'area' | 'claimed' | 'fitted';

/** The measured P–V path with its direction, the work area under it, the claimed process and the fitted polytrope through the first state. */
@Component({
  selector: 'qw-pv-diagram',
  imports: [LineChart, MatCheckboxModule],
  template: `
    <fieldset class="layers">
      <legend class="cdk-visually-hidden">Show on the diagram</legend>
      @for (layer of layers; track layer.key) {
        <mat-checkbox [checked]="shown()[layer.key]" (change)="toggle(layer.key, $event.checked)">
          {{ layer.label }}
        </mat-checkbox>
      }
    </fieldset>
    <qw-line-chart [data]="data()" [options]="options()" [summary]="summary()" />
    <p class="note">
      Pressure in kPa (absolute) against volume in L. The shaded area under the path is the work the gas does,
      W = ∫P dV. {{ curveNote() }}
    </p>
  `,
  styles: `
    .layers { display: flex; flex-wrap: wrap; gap: 0 1rem; border: 0; margin: 0 0 0.5rem; padding: 0; }
    qw-line-chart { height: 22rem; }
    .note { font: var(--mat-sys-body-medium); color: var(--mat-sys-on-surface-variant); }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class PvDiagram {
  /** Absolute pressure, Pa, per reading. */
  readonly pressure = input.required<readonly number[]>();
  /** Volume, m³, per reading. */
  readonly volume = input.required<readonly number[]>();
  /** The process the run claims (isobaric, isochoric, isothermal, adiabatic, polytropic, …). */
  readonly process = input.required<string>();
  /** γ of the run's gas; null when no gas is modelled. */
  readonly gamma = input<GammaChoice | null>(null);
  /** The polytropic index the run claims, if any. */
  readonly claimedIndex = input<number | null>(null);
  /** The index fitted to ln P against ln V, if the path allows one. */
  readonly fittedIndex = input<number | null>(null);

  protected readonly layers: readonly { key: Layer; label: string }[] = [
    { key: 'path', label: 'Measured path' },
    { key: 'arrows', label: 'Direction arrows' },
    { key: 'area', label: 'Work area' },
    { key: 'claimed', label: 'Claimed process' },
    { key: 'fitted', label: 'Fitted polytrope' },
  ];
  protected readonly shown = signal<Record<Layer, boolean>>({
    path: true,
    arrows: true,
    area: true,
    claimed: true,
    fitted: true,
  });

  private readonly colors = chartColors({
    path: ['--mat-sys-primary', 'rgb(40, 90, 160)'],
    claimed: ['--mat-sys-tertiary', 'rgb(120, 80, 150)'],
    fitted: ['--mat-sys-on-surface-variant', 'rgb(80, 80, 80)'],
  });

  private readonly path = computed(() => measuredPath(this.pressure(), this.volume()));
  private readonly claimed = computed(() =>
    claimedCurve(this.process(), this.path(), this.gamma(), this.claimedIndex(), this.fittedIndex()),
  );

  /** What the dashed curves are, in words, with γ and where it came from. */
  protected readonly curveNote = computed(() => {
    const claimed = this.claimed();
    const gamma = this.gamma();
    const fitted = this.fittedIndex();
    const parts: string[] = [];
    parts.push(
      claimed
        ? `The dashed curve is the ${claimed.label.charAt(0).toLowerCase()}${claimed.label.slice(1)} through the first reading.`
        : `The claimed process (${this.process()}) has no curve to draw here.`,
    );
    if (fitted !== null && Number.isFinite(fitted)) {
      parts.push(`The dotted curve is the polytrope fitted to the readings, n = ${fitted.toFixed(3)}.`);
    }
    if (gamma) {
      parts.push(`γ = ${gamma.gamma.toFixed(3)} (${gamma.source}).`);
    }
    return parts.join(' ');
  });

  protected readonly summary = computed(() => {
    const path = this.path();
    if (path.length === 0) {
      return 'P–V diagram: no readings';
    }
    const first = path[0];
    const last = path[path.length - 1];
    return (
      `P–V diagram: ${path.length} readings, from ${first.y.toPrecision(4)} kPa at ${first.x.toPrecision(4)} L ` +
      `to ${last.y.toPrecision(4)} kPa at ${last.x.toPrecision(4)} L`
    );
  });

  protected readonly data = computed((): ChartData<'line', PvPoint[]> => {
    const path = this.path();
    const shown = this.shown();
    const xs = path.map((point) => point.x);
    const vMin = Math.min(...xs);
    const vMax = Math.max(...xs);
    const step = arrowStep(path.length);
    const isArrow = (index: number) => shown.arrows && index > 0 && index < path.length - 1 && index % step === 0;
    const canCompare = path.length > 1 && vMax > vMin && path[0].x > 0;
    const claimed = this.claimed();
    const raw = this.fittedIndex();
    const fitted = raw !== null && Number.isFinite(raw) ? raw : null;
    return {
      datasets: [
        {
          label: 'Measured path',
          data: path,
          hidden: !shown.path,
          borderColor: this.colors.path,
          backgroundColor: withAlpha(this.colors.path, 0.15),
          borderWidth: 2,
          fill: shown.area ? 'origin' : false,
          tension: 0,
          pointStyle: 'triangle',
          pointRadius: (context: ScriptableContext<'line'>) => (isArrow(context.dataIndex) ? 6 : 0),
          pointHoverRadius: 4,
          pointBackgroundColor: this.colors.path,
          pointRotation: (context: ScriptableContext<'line'>) => arrowAngle(context, path),
        },
        {
          label: claimed?.label ?? 'Claimed process (no curve)',
          data: claimed?.points ?? [],
          hidden: !shown.claimed,
          borderColor: this.colors.claimed,
          borderDash: [8, 4],
          borderWidth: 1.5,
          pointRadius: 0,
          fill: false,
        },
        {
          label: fitted === null ? 'Fitted polytrope (none)' : `Fitted polytrope (n = ${fitted.toFixed(3)})`,
          data: canCompare && fitted !== null ? idealCurve(path[0], vMin, vMax, fitted) : [],
          hidden: !shown.fitted,
          borderColor: this.colors.fitted,
          borderDash: [2, 3],
          borderWidth: 1.5,
          pointRadius: 0,
          fill: false,
        },
      ],
    };
  });

  protected readonly options = computed(
    (): ChartOptions<'line'> =>
      lineChartOptions(this.colors, {
        interaction: { mode: 'nearest', intersect: false },
        scales: {
          x: linearAxis('V / L', this.colors),
          y: linearAxis('P / kPa', this.colors, { beginAtZero: true }),
        },
        plugins: {
          // Our own checkboxes show and hide the layers; the legend only names the line styles.
          legend: { labels: { usePointStyle: false }, onClick: () => undefined },
          tooltip: {
            callbacks: {
              label: (item) => `${item.dataset.label}: ${item.parsed.y?.toPrecision(5)} kPa at ${item.parsed.x?.toPrecision(5)} L`,
            },
          },
        },
      }),
  );

  protected toggle(layer: Layer, on: boolean): void {
    this.shown.update((shown) => ({ ...shown, [layer]: on }));
  }
}

/** Rotation (degrees, clockwise from up) of the arrow at a point, along the path on screen. */
function arrowAngle(context: ScriptableContext<'line'>, path: readonly PvPoint[]): number {
  const i = context.dataIndex;
  const { x, y } = context.chart.scales;
  if (!x || !y || i <= 0 || i >= path.length - 1) {
    return 0;
  }
  const dx = x.getPixelForValue(path[i + 1].x) - x.getPixelForValue(path[i - 1].x);
  const dy = y.getPixelForValue(path[i + 1].y) - y.getPixelForValue(path[i - 1].y);
  return (Math.atan2(dx, -dy) * 180) / Math.PI;
}
