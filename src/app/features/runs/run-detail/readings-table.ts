import { CdkVirtualScrollViewport, ScrollingModule } from '@angular/cdk/scrolling';
import { ChangeDetectionStrategy, Component, computed, input, signal, viewChild } from '@angular/core';

import { CHANNEL_LABELS } from '@contract';

import { READING_CHANNELS, READING_SI_UNITS, RunReadings } from '../run-entry.models';

/** Row height in px; the virtual scroll needs it fixed. */
const ROW_HEIGHT = 32;

/** The readings, read-only, in SI; only the channels the run has. Scrolls to and marks one reading on request. */
@Component({
  selector: 'qw-readings-table',
  imports: [ScrollingModule],
  template: `
    <div class="grid" role="table" [attr.aria-label]="'Readings in SI units, ' + readings().count + ' rows'" [attr.aria-rowcount]="readings().count + 1">
      <div class="row head" role="row" [style.grid-template-columns]="template()">
        <span role="columnheader">#</span>
        @for (column of columns(); track column.key) {
          <span role="columnheader">{{ column.label }} ({{ column.unit }})</span>
        }
      </div>
      <cdk-virtual-scroll-viewport [itemSize]="rowHeight" class="viewport" role="rowgroup" tabindex="0" aria-label="Readings, scroll for more">
        <div
          *cdkVirtualFor="let index of indexes(); trackBy: trackIndex"
          class="row"
          role="row"
          [attr.aria-rowindex]="index + 2"
          [attr.id]="'reading-' + (index + 1)"
          [class.marked]="marked() === index + 1"
          [attr.aria-current]="marked() === index + 1 ? 'true' : null"
          [style.grid-template-columns]="template()"
        >
          <span role="cell">{{ index + 1 }}</span>
          @for (column of columns(); track column.key) {
            <span role="cell">{{ show(column.values[index]) }}</span>
          }
        </div>
      </cdk-virtual-scroll-viewport>
    </div>
  `,
  styles: `
    .grid { border: 1px solid var(--mat-sys-outline-variant); border-radius: var(--mat-sys-corner-medium); overflow-x: auto; }
    .viewport { height: 20rem; min-width: fit-content; }
    .row { display: grid; gap: 0.5rem; align-items: center; height: 32px; padding: 0 0.75rem; font-variant-numeric: tabular-nums; white-space: nowrap; }
    .row > span { text-align: end; }
    .head { font: var(--mat-sys-title-small); border-bottom: 1px solid var(--mat-sys-outline-variant); height: 40px; }
    .marked { background: var(--mat-sys-secondary-container); color: var(--mat-sys-on-secondary-container); outline: 2px solid var(--mat-sys-secondary); outline-offset: -2px; }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ReadingsTable {
  readonly readings = input.required<RunReadings>();

  private readonly viewport = viewChild.required(CdkVirtualScrollViewport);
  protected readonly rowHeight = ROW_HEIGHT;
  /** The 1-based reading marked by the last "Show reading". */
  protected readonly marked = signal<number | null>(null);

  protected readonly columns = computed(() => {
    const readings = this.readings();
    const present = READING_CHANNELS.filter((channel) => readings[channel]?.some((value) => value !== null));
    return [
      { key: 'time', label: CHANNEL_LABELS.time, unit: READING_SI_UNITS.time, values: readings.time as readonly (number | null)[] },
      ...present.map((channel) => ({
        key: channel,
        label: CHANNEL_LABELS[channel],
        unit: READING_SI_UNITS[channel],
        values: readings[channel],
      })),
    ];
  });
  protected readonly template = computed(() => `3.5rem repeat(${this.columns().length}, minmax(7.5rem, 1fr))`);
  protected readonly indexes = computed(() => Array.from({ length: this.readings().count }, (_, i) => i));

  /** Scrolls reading `n` (1-based) into the middle of the view and marks it. */
  showReading(n: number): void {
    this.marked.set(n);
    const viewport = this.viewport();
    const offset = Math.max(0, (n - 1) * ROW_HEIGHT - viewport.getViewportSize() / 2 + ROW_HEIGHT / 2);
    viewport.scrollToOffset(offset, 'smooth');
  }

  protected trackIndex(_: number, index: number): number {
    return index;
  }

  protected show(value: number | null | undefined): string {
    if (value === null || value === undefined) {
      return '—';
    }
    if (value === 0) {
      return '0';
    }
    return Math.abs(value) >= 1e-3 && Math.abs(value) < 1e7 ? String(Number(value.toPrecision(7))) : value.toExponential(5);
  }
}
