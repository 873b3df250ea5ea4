import { TestBed } from '@angular/core/testing';
import { FormControl } from '@angular/forms';

import { ReadingsGrid, GridColumn } from './readings-grid';
import { ReadingsSheet } from './readings-sheet';

function columns(): GridColumn[] {
  return [
    { key: 'time', label: 'Time', kind: 'time', unit: new FormControl('s', { nonNullable: true }), unitText: 's' },
    { key: 'pressure', label: 'Pressure', kind: 'pressure', unit: new FormControl('kPa', { nonNullable: true }), unitText: 'kPa' },
    { key: 'temperature', label: 'Temperature', kind: 'temperature', unit: new FormControl('degC', { nonNullable: true }), unitText: '°C' },
  ];
}

describe('ReadingsGrid', () => {
  let sheet: ReadingsSheet;
  let root: HTMLElement;
  let fixture: ReturnType<typeof TestBed.createComponent<ReadingsGrid>>;

  beforeEach(async () => {
    sheet = new ReadingsSheet(2);
    fixture = TestBed.createComponent(ReadingsGrid);
    fixture.componentRef.setInput('sheet', sheet);
    fixture.componentRef.setInput('columns', columns());
    root = fixture.nativeElement as HTMLElement;
    await render();
  });

  async function render(): Promise<void> {
    fixture.detectChanges();
    await fixture.whenStable();
    fixture.detectChanges();
  }

  function cell(row: number, col: number): HTMLInputElement {
    const input = root.querySelector<HTMLInputElement>(`input[data-row="${row}"][data-col="${col}"]`);
    if (!input) {
      throw new Error(`no cell at row ${row}, column ${col}`);
    }
    return input;
  }

  function press(target: HTMLElement, key: string, shiftKey = false): KeyboardEvent {
    const event = new KeyboardEvent('keydown', { key, shiftKey, bubbles: true, cancelable: true });
    target.dispatchEvent(event);
    return event;
  }

  async function type(row: number, col: number, text: string): Promise<void> {
    const input = cell(row, col);
    input.focus();
    input.value = text;
    input.dispatchEvent(new Event('input', { bubbles: true }));
    await render();
  }

  function paste(target: HTMLElement, text: string): Event {
    const event = new Event('paste', { bubbles: true, cancelable: true }) as Event & { clipboardData: unknown };
    Object.defineProperty(event, 'clipboardData', { value: { getData: (type: string) => (type === 'text/plain' ? text : '') } });
    target.dispatchEvent(event);
    return event;
  }

  it('labels every cell with its reading number, quantity and unit', () => {
    expect(cell(1, 2).getAttribute('aria-label')).toBe('Reading 2, temperature in °C');
    expect(cell(0, 1).getAttribute('aria-label')).toBe('Reading 1, pressure in kPa');
  });

  it('moves down on Enter and adds a row below the last one', async () => {
    cell(0, 1).focus();
    expect(press(cell(0, 1), 'Enter').defaultPrevented).toBe(true);
    expect(document.activeElement).toBe(cell(1, 1));

    press(cell(1, 1), 'Enter');
    await render();
    expect(sheet.rowCount).toBe(3);
    expect(document.activeElement).toBe(cell(2, 1));

    press(cell(2, 1), 'Enter', true);
    expect(document.activeElement).toBe(cell(1, 1));
  });

  it('moves right on Tab, wraps to the next row, and back on Shift+Tab', () => {
    cell(0, 0).focus();
    press(cell(0, 0), 'Tab');
    expect(document.activeElement).toBe(cell(0, 1));
    press(cell(0, 2), 'Tab');
    expect(document.activeElement).toBe(cell(1, 0));
    press(cell(1, 0), 'Tab', true);
    expect(document.activeElement).toBe(cell(0, 2));
  });

  it('lets Tab leave the grid from its very last cell, so the keyboard is not trapped', () => {
    expect(press(cell(1, 2), 'Tab').defaultPrevented).toBe(false);
  });

  it('opens a fresh row below once the last row gets text, so Enter never waits for a new row', async () => {
    await type(1, 0, '20');
    expect(sheet.rowCount).toBe(3);
    press(cell(1, 0), 'Enter');
    expect(document.activeElement).toBe(cell(2, 0));
  });

  it('keeps typed text and moves with the arrow keys', async () => {
    await type(0, 0, '12.5');
    expect(sheet.cell(0, 'time')).toBe('12.5');
    const input = cell(0, 0);
    input.setSelectionRange(4, 4);
    press(input, 'ArrowRight');
    expect(document.activeElement).toBe(cell(0, 1));
    press(cell(0, 1), 'ArrowDown');
    expect(document.activeElement).toBe(cell(1, 1));
  });

  it('pastes a 3 × 2 block from the focused cell, adding the rows it needs', async () => {
    const event = paste(cell(1, 1), '101.3\t21.0\r\n102.4\t21.5\r\n103.9\t22.25\r\n');
    await render();

    expect(event.defaultPrevented).toBe(true);
    // Rows 2 to 4 hold the block; one empty row stays below it to go on typing.
    expect(sheet.rowCount).toBe(5);
    expect([1, 2, 3].map((row) => [sheet.cell(row, 'pressure'), sheet.cell(row, 'temperature')])).toEqual([
      ['101.3', '21.0'],
      ['102.4', '21.5'],
      ['103.9', '22.25'],
    ]);
    expect(sheet.cell(0, 'pressure')).toBe('');
    expect(sheet.cell(1, 'time')).toBe('');
    expect(cell(3, 2).value).toBe('22.25');
  });

  it('leaves a single value to the browser paste', () => {
    expect(paste(cell(0, 1), '101.3').defaultPrevented).toBe(false);
  });

  it('shows a non-number as an inline error beside its row, tied to the cell', async () => {
    await type(0, 1, '10l.3');

    const input = cell(0, 1);
    expect(input.getAttribute('aria-invalid')).toBe('true');
    const described = root.querySelector(`#${input.getAttribute('aria-describedby')}`);
    expect(described?.textContent).toContain('Pressure: “10l.3” is not a number (use a decimal point)');
    expect(cell(0, 2).getAttribute('aria-invalid')).toBeNull();
  });

  it('says so when time does not increase', async () => {
    await type(0, 0, '10');
    await type(1, 0, '5');

    expect(cell(1, 0).getAttribute('aria-invalid')).toBe('true');
    expect(root.querySelector('#reading-errors-1')?.textContent).toContain('Time must increase: 5 is not after 10');
    expect(cell(0, 0).getAttribute('aria-invalid')).toBeNull();
  });

  it('adds and removes rows with the buttons below the grid', async () => {
    const buttons = Array.from(root.querySelectorAll<HTMLButtonElement>('.grid-actions button'));
    buttons.find((b) => b.textContent?.includes('Add reading'))!.click();
    await render();
    expect(sheet.rowCount).toBe(3);

    await type(1, 0, '7');
    buttons.find((b) => b.textContent?.includes('Remove reading'))!.click();
    await render();
    expect(sheet.rowCount).toBe(2);
    expect(sheet.cell(1, 'time')).toBe('');
  });
});
