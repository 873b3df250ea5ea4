import { DecimalPipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';
import { correctionSentence } from '@contract';

import { WithUncertaintyPipe, roundToUncertainty } from '../../../shared/value-with-uncertainty/value-with-uncertainty-pipe';
import { VerdictDisplay } from '../../../shared/verdict-display/verdict-display';
import { McHistogramChart } from './mc-histogram';
import { BalanceResult } from '../run-detail.models';

/** One side of the balance drawn as an interval on a shared scale (percent of the track). */
interface IntervalBar {
  label: string;
  value: number;
  U: number;
  left: number;
  width: number;
  centre: number;
}

/** ΔU beside Q − W with their expanded uncertainties, the residual, En and the verdict. */
@Component({
  selector: 'qw-balance-card',
  imports: [DecimalPipe, MatIconModule, McHistogramChart, VerdictDisplay, WithUncertaintyPipe],
  templateUrl: './balance-card.html',
  styleUrl: './balance-card.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class BalanceCard {
  readonly result = input.required<BalanceResult>();
  /** The server's one sentence of why, shown beside a verdict that breaks or is indeterminate. */
  readonly why = input<string | null>(null);

  protected readonly k = computed(() => this.result().residual.k);

  /** Q − W with U from u(Q) and u(W) and their correlation (GUM 5.2.2). */
  protected readonly heatMinusWork = computed(() => {
    const { heat, work, correlations } = this.result();
    const rho = correlations?.W_Q ?? 0;
    const u = Math.sqrt(Math.max(0, heat.u ** 2 + work.u ** 2 - 2 * rho * heat.u * work.u));
    return { value: heat.total - work.measured, U: this.k() * u };
  });

  protected readonly bars = computed((): IntervalBar[] => {
    const dU = this.result().internalEnergy;
    const sides = [
      { label: 'ΔU', value: dU.value, U: dU.U },
      { label: 'Q − W', ...this.heatMinusWork() },
    ];
    const low = Math.min(...sides.map((side) => side.value - side.U));
    const high = Math.max(...sides.map((side) => side.value + side.U));
    // A little margin so that a zero-width interval still shows its centre mark inside the track.
    const pad = (high - low) * 0.1 || Math.abs(high) * 0.01 || 1;
    const span = high - low + 2 * pad;
    const at = (x: number) => ((x - low + pad) / span) * 100;
    return sides.map((side) => ({
      ...side,
      left: at(side.value - side.U),
      width: Math.max(0.5, at(side.value + side.U) - at(side.value - side.U)),
      centre: at(side.value),
    }));
  });

  /** One sentence per certificate correction the check applied (none for results before engine 2.3). */
  protected readonly corrections = computed(() => (this.result().corrections ?? []).map(correctionSentence));

  protected readonly indeterminate = computed(() => this.result().verdict === 'indeterminate');

  /** An interval end rounded to the decimal place of the uncertainty it comes with (GUM 7.2.6). */
  protected rounded(x: number, U: number): string {
    return roundToUncertainty(x, U).value;
  }
}
