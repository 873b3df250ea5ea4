import { LiveAnnouncer } from '@angular/cdk/a11y';
import { CdkVirtualScrollViewport, ScrollingModule } from '@angular/cdk/scrolling';
import {
  ChangeDetectionStrategy,
  Component,
  ElementRef,
  Injector,
  afterNextRender,
  computed,
  effect,
  inject,
  input,
  signal,
  viewChild,
} from '@angular/core';
import { FormControl } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';

import { UnitKind } from '../unit-table';
import { UnitPicker } from '../unit-picker/unit-picker';
import { ReadingsSheet, SheetKey } from './readings-sheet';

/** One column of the grid as the page describes it. */
export interface GridColumn {
  key: SheetKey;
  /** Column heading, e.g. "Pressure". */
  label: string;
  kind: UnitKind;
  /** The column's unit, picked in its header. */
  unit: FormControl<string>;
  /** The unit as people read it (°C, kPa), for cell labels. */
  unitText: string;
}

/** Row height in px; the virtual scroll needs every row the same height. */
export const ROW_HEIGHT = 44;

/**
 * The readings grid: one row per time point, one text box per column, fast keyboard entry (Enter
 * down, Tab right, Shift back, arrows), paste of a block from a spreadsheet, inline row errors
 * and virtual scrolling so that tens of thousands of rows stay quick.
 */
@Component({
  selector: 'qw-readings-grid',
  imports: [MatButtonModule, MatIconModule, ScrollingModule, UnitPicker],
  templateUrl: './readings-grid.html',
  styleUrl: './readings-grid.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ReadingsGrid {
  private readonly host = inject<ElementRef<HTMLElement>>(ElementRef);
  private readonly announcer = inject(LiveAnnouncer);
  private readonly injector = inject(Injector);
  private readonly viewport = viewChild(CdkVirtualScrollViewport);

  readonly sheet = input.required<ReadingsSheet>();
  readonly columns = input.required<readonly GridColumn[]>();

  /** Row of the cell last focused, for the row buttons below the grid. */
  protected readonly currentRow = signal(0);

  protected readonly rowIndexes = computed(() => {
    const sheet = this.sheet();
    sheet.revision();
    return Array.from({ length: sheet.rowCount }, (_, i) => i);
  });
  protected readonly rowHeight = ROW_HEIGHT;
  /** Grows with the rows up to twelve, then scrolls; the virtual scroll re-measures after each change. */
  protected readonly viewportHeight = computed(() => Math.min(this.rowIndexes().length, 12) * ROW_HEIGHT + 2);
  protected readonly template = computed(
    () => `2.5rem repeat(${this.columns().length}, minmax(6.5rem, 1fr)) minmax(9rem, 1.6fr) 2.75rem`,
  );

  constructor() {
    effect(() => {
      this.viewportHeight();
      afterNextRender(() => this.viewport()?.checkViewportSize(), { injector: this.injector });
    });
  }

  protected text(row: number, key: SheetKey): string {
    this.sheet().revision();
    return this.sheet().cell(row, key);
  }

  protected errorsOf(row: number): string[] {
    this.sheet().revision();
    return this.sheet().rowErrors(row, this.columns());
  }

  protected cellInvalid(row: number, column: GridColumn): boolean {
    this.sheet().revision();
    return this.sheet().cellError(row, column.key, column.label) !== null;
  }

  protected cellLabel(row: number, column: GridColumn): string {
    return `Reading ${row + 1}, ${column.label.toLowerCase()} in ${column.unitText}`;
  }

  protected trackRow(_: number, row: number): number {
    return row;
  }

  protected edit(row: number, key: SheetKey, event: Event): void {
    this.sheet().setCell(row, key, (event.target as HTMLInputElement).value);
  }

  protected rememberCell(event: FocusEvent): void {
    const cell = cellOf(event.target);
    if (cell) {
      this.currentRow.set(cell.row);
    }
  }

  protected addRow(): void {
    this.sheet().addRow();
    const row = this.sheet().rowCount - 1;
    void this.announcer.announce(`Reading ${row + 1} added.`, 'polite');
    this.focusCell(row, 0);
  }

  protected removeRow(row: number): void {
    this.sheet().removeRow(row);
    void this.announcer.announce(`Reading ${row + 1} removed.`, 'polite');
    this.currentRow.set(Math.min(row, this.sheet().rowCount - 1));
  }

  /** Spreadsheet keys: Enter down, Tab right, Shift for back, arrows; new rows appear at the end. */
  protected moveFocus(event: KeyboardEvent): void {
    const cell = cellOf(event.target);
    if (!cell) {
      return;
    }
    const last = this.columns().length - 1;
    const { row, col } = cell;
    const input = event.target as HTMLInputElement;
    let next: { row: number; col: number } | null = null;
    switch (event.key) {
      case 'Enter':
        next = event.shiftKey ? { row: row - 1, col } : { row: row + 1, col };
        if (!event.shiftKey && row === this.sheet().rowCount - 1) {
          this.sheet().addRow();
        }
        break;
      case 'Tab':
        if (event.shiftKey) {
          next = col > 0 ? { row, col: col - 1 } : row > 0 ? { row: row - 1, col: last } : null;
        } else {
          // Tab leaves the grid from its very last cell, so the keyboard is never trapped.
          next = col < last ? { row, col: col + 1 } : row < this.sheet().rowCount - 1 ? { row: row + 1, col: 0 } : null;
        }
        break;
      case 'ArrowDown':
        next = { row: row + 1, col };
        break;
      case 'ArrowUp':
        next = { row: row - 1, col };
        break;
      case 'ArrowRight':
        next = input.selectionStart === input.value.length && input.selectionEnd === input.value.length ? { row, col: col + 1 } : null;
        break;
      case 'ArrowLeft':
        next = input.selectionStart === 0 && input.selectionEnd === 0 ? { row, col: col - 1 } : null;
        break;
    }
    if (!next || next.row < 0 || next.row >= this.sheet().rowCount || next.col < 0 || next.col > last) {
      return;
    }
    event.preventDefault();
    this.focusCell(next.row, next.col);
  }

  /** A block with tabs or line breaks fills the grid from the focused cell; a single value pastes as usual. */
  protected pasteBlock(event: ClipboardEvent): void {
    const cell = cellOf(event.target);
    const text = event.clipboardData?.getData('text/plain') ?? '';
    if (!cell || !/[\t\n\r]/.test(text.replace(/[\r\n]+$/, ''))) {
      return;
    }
    event.preventDefault();
    const keys = this.columns().map((c) => c.key);
    const landed = this.sheet().paste(cell.row, keys, cell.col, text);
    void this.announcer.announce(
      `Pasted ${landed.rows} ${landed.rows === 1 ? 'row' : 'rows'} by ${landed.columns} ${landed.columns === 1 ? 'column' : 'columns'} from reading ${cell.row + 1}.`,
      'polite',
    );
  }

  /** Focuses a cell, scrolling it into the rendered window first when virtual scrolling left it out. */
  focusCell(row: number, col: number): void {
    if (this.tryFocus(row, col)) {
      return;
    }
    // A row just added appears after the next render; a far-away row once the viewport has scrolled.
    afterNextRender({ read: () => this.tryFocus(row, col) || this.scrollThenFocus(row, col) }, { injector: this.injector });
  }

  private scrollThenFocus(row: number, col: number, attempts = 12): boolean {
    if (attempts === 12) {
      this.viewport()?.scrollToIndex(Math.max(0, row - 2));
    }
    if (attempts > 0) {
      setTimeout(() => this.tryFocus(row, col) || this.scrollThenFocus(row, col, attempts - 1), 16);
    }
    return false;
  }

  private tryFocus(row: number, col: number): boolean {
    const selector = `input[data-row="${row}"][data-col="${col}"]`;
    const element = this.host.nativeElement.querySelector<HTMLInputElement>(selector);
    element?.focus();
    element?.select();
    return !!element;
  }
}

function cellOf(target: EventTarget | null): { row: number; col: number } | null {
  if (!(target instanceof HTMLInputElement) || target.dataset['row'] === undefined) {
    return null;
  }
  return { row: Number(target.dataset['row']), col: Number(target.dataset['col']) };
}
