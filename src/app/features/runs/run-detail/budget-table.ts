import { BreakpointObserver } from '@angular/cdk/layout';
import { DecimalPipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, inject, input } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { MatTableModule } from '@angular/material/table';
import { map } from 'rxjs';

import { BudgetEntry } from '../run-detail.models';

/** Below this width the numbers come first and a line says the table scrolls sideways. */
export const NARROW_BUDGET = '(max-width: 720px)';
const WIDE_COLUMNS = ['source', 'distribution', 'u', 'sensitivity', 'share'];
const NARROW_COLUMNS = ['source', 'share', 'u', 'sensitivity', 'distribution'];

/** The uncertainty budget of r, largest share of u²(r) first. */
@Component({
  selector: 'qw-budget-table',
  imports: [DecimalPipe, MatTableModule],
  template: `
    @if (narrow()) {
      <p class="cue" aria-hidden="true">Share first; swipe the table sideways for u, ∂r/∂x and the distribution →</p>
    }
    <div class="table-scroll" [class.narrow]="narrow()" tabindex="0" role="region" aria-label="Uncertainty budget, scrolls sideways on narrow screens">
      <table mat-table [dataSource]="rows()" aria-label="Uncertainty budget of the residual r">
        <ng-container matColumnDef="source">
          <th mat-header-cell *matHeaderCellDef>Source</th>
          <td mat-cell *matCellDef="let row">{{ row.source }}</td>
        </ng-container>
        <ng-container matColumnDef="distribution">
          <th mat-header-cell *matHeaderCellDef>Distribution</th>
          <td mat-cell *matCellDef="let row">{{ row.distribution }}</td>
        </ng-container>
        <ng-container matColumnDef="u">
          <th mat-header-cell *matHeaderCellDef class="number">Standard uncertainty u</th>
          <td mat-cell *matCellDef="let row" class="number">{{ scientific(row.u) }} {{ row.unit === '1' ? '' : row.unit }}</td>
        </ng-container>
        <ng-container matColumnDef="sensitivity">
          <th mat-header-cell *matHeaderCellDef class="number">Sensitivity ∂r/∂x</th>
          <td mat-cell *matCellDef="let row" class="number">{{ scientific(row.sensitivity) }} J{{ row.unit === '1' ? '' : '/' + row.unit }}</td>
        </ng-container>
        <ng-container matColumnDef="share">
          <th mat-header-cell *matHeaderCellDef>Share of u²(r)</th>
          <td mat-cell *matCellDef="let row">
            <span class="share">
              <span class="share-value">{{ row.share * 100 | number: '1.1-1' }} %</span>
              <span class="share-track" aria-hidden="true"><span class="share-bar" [style.width.%]="row.share * 100"></span></span>
            </span>
          </td>
        </ng-container>
        <tr mat-header-row *matHeaderRowDef="columns()"></tr>
        <tr mat-row *matRowDef="let row; columns: columns()"></tr>
      </table>
    </div>
  `,
  styles: `
    table { width: 100%; }
    .cue { margin: 0 0 0.5rem; color: var(--mat-sys-on-surface-variant); font: var(--mat-sys-body-small); }
    .narrow .mat-column-source { min-width: 9rem; }
    .mat-column-source { min-width: 12rem; }
    .number { text-align: end; font-variant-numeric: tabular-nums; white-space: nowrap; }
    .share { display: flex; align-items: center; gap: 0.5rem; min-width: 10rem; }
    .share-value { width: 3.5rem; text-align: end; font-variant-numeric: tabular-nums; }
    .share-track { flex: 1; height: 0.5rem; border-radius: 0.25rem; background: var(--mat-sys-surface-container-high); }
    .share-bar { display: block; height: 100%; border-radius: 0.25rem; background: var(--mat-sys-primary); }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class BudgetTable {
  readonly budget = input.required<readonly BudgetEntry[]>();

  /** At phone width the share comes straight after the source, so the deciding number is on screen. */
  protected readonly narrow = toSignal(inject(BreakpointObserver).observe(NARROW_BUDGET).pipe(map((state) => state.matches)), { initialValue: false });
  protected readonly columns = computed(() => (this.narrow() ? NARROW_COLUMNS : WIDE_COLUMNS));
  protected readonly rows = computed(() => [...this.budget()].sort((a, b) => b.share - a.share));

  /** Three significant digits; powers of ten outside 0.001 … 100 000 so no value reads as 0. */
  protected scientific(x: number): string {
    if (x === 0) {
      return '0';
    }
    return Math.abs(x) >= 1e-3 && Math.abs(x) < 1e5 ? String(Number(x.toPrecision(3))) : x.toExponential(2);
  }
}
