import { CdkVirtualScrollViewport, ScrollingModule } from '@angular/cdk/scrolling';
import { ChangeDetectionStrategy, Component, DestroyRef, ElementRef, afterNextRender, afterRenderEffect, computed, inject, input, signal, viewChild } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';

import { CHANNEL_LABELS } from '@contract';
import { READING_CHANNELS, READING_SI_UNITS, ReadingChannel, RunReadings, RunSetup } from '../run-entry.models';
import { CHANNEL_KINDS, UnitKind, displayFromSi, fromSi, unitLabel, unitsOf } from '../run-entry/unit-table';

/** Row height in px; the virtual scroll needs it fixed. */
const ROW_HEIGHT = 32;

/** At most this many decimals are inferred from the readings of a run that recorded none. */
const MAX_DECIMALS = 9;

export interface ReadingColumn {
  key: string;
  label: string;
  unit: string;
  values: readonly (number | null)[];
  /** SI to the shown unit, and the decimals every reading of the column gets. */
  kind: UnitKind | null;
  shownUnit: string;
  decimals: number | null;
}

/** Decimals in a number as a person would write it (12 significant digits hide the round trip's float noise). */
function decimalsOf(text: string): number | null {
  if (/e/i.test(text)) return null;
  const dot = text.indexOf('.');
  return dot < 0 ? 0 : text.length - dot - 1;
}

/**
 * The readings, read-only, in the unit each channel was entered in, with the decimals they were entered in
 * (so 3.000 V stays 3.000 V; runs that recorded none take their most precise reading's); SI on demand. Only the channels the run
 * has. Scrolls to and marks one reading on request.
 */
@Component({
  selector: 'qw-readings-table',
  imports: [MatButtonModule, ScrollingModule],
  template: `
    <div class="units">
      <button mat-stroked-button type="button" [attr.aria-pressed]="siShown()" (click)="siShown.set(!siShown())">
        {{ siShown() ? 'Show as entered' : 'Show in SI units' }}
      </button>
      <span class="note">{{ siShown() ? 'Values in SI units, as the balance check reads them.' : 'Values in the units they were entered in.' }}</span>
    </div>
    @if (overflows()) {
      <p class="cue" aria-hidden="true">Swipe the table sideways for the other columns →</p>
    }
    <div #grid class="grid" [class.overflows]="overflows()" role="table" [attr.aria-label]="(siShown() ? 'Readings in SI units, ' : 'Readings as entered, ') + readings().count + ' rows'" [attr.aria-rowcount]="readings().count + 1">
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
            <span role="cell">{{ show(column, column.values[index]) }}</span>
          }
        </div>
      </cdk-virtual-scroll-viewport>
    </div>
  `,
  styles: `
    .units { display: flex; flex-wrap: wrap; align-items: center; gap: 0.5rem 1rem; margin-bottom: 0.5rem; }
    .note { color: var(--mat-sys-on-surface-variant); font: var(--mat-sys-body-medium); }
    .grid { border: 1px solid var(--mat-sys-outline-variant); border-radius: var(--mat-sys-corner-medium); overflow-x: auto; }
    .viewport { height: 20rem; min-width: fit-content; }
    .row { display: grid; gap: 0.5rem; align-items: center; height: 32px; padding: 0 0.75rem; font-variant-numeric: tabular-nums; white-space: nowrap; }
    .row > span { text-align: end; }
    .cue { margin: 0 0 0.5rem; color: var(--mat-sys-on-surface-variant); font: var(--mat-sys-body-small); }
    /* While the table scrolls sideways the reading number stays in view, ruled off from the columns passing under it. */
    .overflows .row > span:first-child { position: sticky; left: 0; z-index: 1; padding-right: 0.5rem; background: var(--mat-sys-surface); border-right: 1px solid var(--mat-sys-outline-variant); }
    .overflows .marked > span:first-child { background: var(--mat-sys-secondary-container); }
    .head { font: var(--mat-sys-title-small); border-bottom: 1px solid var(--mat-sys-outline-variant); height: 40px; }
    .marked { background: var(--mat-sys-secondary-container); color: var(--mat-sys-on-secondary-container); outline: 2px solid var(--mat-sys-secondary); outline-offset: -2px; }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ReadingsTable {
  readonly readings = input.required<RunReadings>();

  private readonly viewport = viewChild.required(CdkVirtualScrollViewport);
  private readonly grid = viewChild.required<ElementRef<HTMLElement>>('grid');
  /** The columns are wider than the screen (a phone, or many channels): a line says the table scrolls sideways. */
  protected readonly overflows = signal(false);
  protected readonly rowHeight = ROW_HEIGHT;
  /** The 1-based reading marked by the last "Show reading". */
  protected readonly marked = signal<number | null>(null);

  /** The run's setup: the unit each channel (and time) was entered in. */
  readonly setup = input<RunSetup | null>(null);
  /** SI on demand; as entered by default. */
  protected readonly siShown = signal(false);

  protected readonly columns = computed(() => readingColumns(this.readings(), this.setup(), this.siShown()));
  protected readonly template = computed(() => `3.5rem repeat(${this.columns().length}, minmax(7.5rem, 1fr))`);
  protected readonly indexes = computed(() => Array.from({ length: this.readings().count }, (_, i) => i));

  constructor() {
    const destroyRef = inject(DestroyRef);
    const measure = () => {
      const grid = this.grid().nativeElement;
      this.overflows.set(grid.scrollWidth > grid.clientWidth + 1);
    };
    // Measured after each render that may change the columns, and whenever the table's width changes.
    afterRenderEffect({ read: () => { this.columns(); measure(); } });
    afterNextRender(() => {
      if (typeof ResizeObserver === 'undefined') {
        return;
      }
      const observer = new ResizeObserver(measure);
      observer.observe(this.grid().nativeElement);
      destroyRef.onDestroy(() => observer.disconnect());
    });
  }

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

  protected show(column: ReadingColumn, value: number | null | undefined): string {
    return formatReading(column, value);
  }
}

/**
 * The run's columns, each in the unit it was entered in (or SI), with the decimals recorded for the channel
 * when its readings were entered or imported, or else those of its most precise reading.
 */
export function readingColumns(readings: RunReadings, setup: RunSetup | null, si: boolean): ReadingColumn[] {
  const present = READING_CHANNELS.filter((channel) => readings[channel]?.some((value) => value !== null));
  const timeUnit = setup?.time?.unit;
  const column = (key: 'time' | ReadingChannel, kind: UnitKind, entered: string | undefined, values: readonly (number | null)[], recorded?: number): ReadingColumn => {
    const known = !si && entered !== undefined && unitsOf(kind).includes(entered);
    const shownUnit = known ? entered! : READING_SI_UNITS[key];
    // The decimals recorded when the readings were typed or imported; runs stored before that infer them.
    let decimals: number | null = recorded ?? 0;
    if (known && recorded === undefined) {
      for (const value of values) {
        const d = value === null ? 0 : decimalsOf(displayFromSi(kind, shownUnit, value));
        decimals = d === null || decimals === null ? null : Math.max(decimals, d);
      }
    }
    return {
      key, label: CHANNEL_LABELS[key], unit: unitLabel(shownUnit), values, kind: known ? kind : null, shownUnit,
      decimals: known && decimals !== null ? Math.min(decimals, recorded ?? MAX_DECIMALS) : null,
    };
  };
  return [
    column('time', 'time', timeUnit === 'iso' ? undefined : timeUnit, readings.time),
    ...present.map((channel) => {
      const entry = setup?.channels?.[channel];
      return column(channel, CHANNEL_KINDS[channel], entry?.unit, readings[channel], entry?.decimals);
    }),
  ];
}

/** One reading as text: in the column's entered unit with its decimals, or in SI with up to 7 significant digits. */
export function formatReading(column: ReadingColumn, value: number | null | undefined): string {
  if (value === null || value === undefined) {
    return '—';
  }
  if (column.kind) {
    return column.decimals === null ? displayFromSi(column.kind, column.shownUnit, value) : fromSi(column.kind, column.shownUnit, value).toFixed(column.decimals);
  }
  return String(Number(value.toPrecision(7)));
}
