import { TestBed } from '@angular/core/testing';

import { RunReadings, RunSetup } from '../run-entry.models';
import { ReadingsTable, formatReading, readingColumns } from './readings-table';

describe('ReadingsTable', () => {
  // Stored in SI, as the server keeps them: 3.000 V and 3.012 V, 500 mL and 502.5 mL, 21.50 °C and 21.62 °C.
  const readings = {
    count: 2,
    time: [0, 60],
    voltage: [3, 3.012],
    current: [null, null],
    pressure: [null, null],
    volume: [5e-4, 5.025e-4],
    displacement: [null, null],
    temperature: [294.65, 294.77],
    power: [null, null],
  } as RunReadings;
  const setup: RunSetup = {
    time: { unit: 'min' },
    channels: { voltage: { unit: 'V' }, volume: { unit: 'mL' }, temperature: { unit: 'degC' } },
  };

  async function render() {
    TestBed.configureTestingModule({});
    const fixture = TestBed.createComponent(ReadingsTable);
    fixture.componentRef.setInput('readings', readings);
    fixture.componentRef.setInput('setup', setup);
    fixture.detectChanges();
    await fixture.whenStable();
    fixture.detectChanges();
    const root = fixture.nativeElement as HTMLElement;
    const text = (selector: string) => Array.from(root.querySelectorAll(selector)).map((e) => e.textContent!.trim());
    return { fixture, root, text };
  }

  it('shows each reading in the unit and with the decimals it was entered in, units written as people write them', async () => {
    const { text } = await render();
    expect(text('[role="columnheader"]')).toEqual(['#', 'Time (min)', 'Volume (mL)', 'Temperature (°C)', 'Heater voltage (V)']);
    // The rows themselves (the virtual scroll draws none without a layout): each column's values as text.
    const cells = readingColumns(readings, setup, false).map((c) => c.values.map((v) => formatReading(c, v)));
    expect(cells).toEqual([['0', '1'], ['500.0', '502.5'], ['21.50', '21.62'], ['3.000', '3.012']]);
  });

  it('shows 3.000 V as 3.000 V when the channel recorded three decimals, even if every reading ends in zeros', () => {
    const flat = { ...readings, voltage: [3, 3] } as RunReadings;
    const recorded: RunSetup = { ...setup, channels: { ...setup.channels, voltage: { unit: 'V', decimals: 3 } } };
    const cells = (s: RunSetup | null) => Object.fromEntries(readingColumns(flat, s, false).map((c) => [c.key, c.values.map((v) => formatReading(c, v))]));
    expect(cells(recorded)['voltage']).toEqual(['3.000', '3.000']);
    // A channel without recorded decimals beside it still takes its most precise reading's.
    expect(cells(recorded)['volume']).toEqual(['500.0', '502.5']);
    // A run stored before decimals were recorded infers them from its most precise reading, so this column shows "3".
    expect(cells(setup)['voltage']).toEqual(['3', '3']);
  });

  it('says the table scrolls sideways only while its columns are wider than the screen', async () => {
    const { fixture, root } = await render();
    expect(root.querySelector('.cue')).toBeNull();
    // jsdom lays nothing out: give the table a phone's width and columns wider than it, as at 390 px.
    const grid = root.querySelector<HTMLElement>('[role="table"]')!;
    Object.defineProperty(grid, 'clientWidth', { configurable: true, value: 358 });
    Object.defineProperty(grid, 'scrollWidth', { configurable: true, value: 620 });
    fixture.componentRef.setInput('readings', { ...readings });
    fixture.detectChanges();
    await fixture.whenStable();
    fixture.detectChanges();
    expect(root.querySelector('.cue')?.textContent?.trim()).toBe('Swipe the table sideways for the other columns →');
    expect(grid.classList).toContain('overflows');
  });

  it('switches to SI units on request and back, saying which it shows', async () => {
    const { fixture, root, text } = await render();
    const toggle = root.querySelector<HTMLButtonElement>('button')!;
    expect(toggle.textContent?.trim()).toBe('Show in SI units');
    toggle.click();
    fixture.detectChanges();
    expect(toggle.getAttribute('aria-pressed')).toBe('true');
    expect(text('[role="columnheader"]')).toEqual(['#', 'Time (s)', 'Volume (m³)', 'Temperature (K)', 'Heater voltage (V)']);
    const cells = readingColumns(readings, setup, true).map((c) => c.values.map((v) => formatReading(c, v)));
    expect(cells).toEqual([['0', '60'], ['0.0005', '0.0005025'], ['294.65', '294.77'], ['3', '3.012']]);
    expect(root.querySelector('[role="table"]')?.getAttribute('aria-label')).toBe('Readings in SI units, 2 rows');
    toggle.click();
    fixture.detectChanges();
    expect(root.querySelector('[role="table"]')?.getAttribute('aria-label')).toBe('Readings as entered, 2 rows');
  });
});
