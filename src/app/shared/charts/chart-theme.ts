import { ElementRef, inject } from '@angular/core';
import type { ChartOptions, ScaleOptions } from 'chart.js';

/**
 * Resolves a Material system colour for the canvas, which cannot read CSS variables itself.
 * A probe element lets the browser resolve light-dark() and friends to plain rgb().
 */
export function themeColor(host: HTMLElement, variable: string, fallback: string): string {
  const probe = host.ownerDocument.createElement('span');
  probe.style.color = `var(${variable}, ${fallback})`;
  probe.style.display = 'none';
  host.appendChild(probe);
  const color = getComputedStyle(probe).color || fallback;
  probe.remove();
  return color;
}

/** The same colour with an alpha, for fills. */
export function withAlpha(color: string, alpha: number): string {
  const match = /rgba?\((\d+),\s*(\d+),\s*(\d+)/.exec(color);
  return match ? `rgba(${match[1]}, ${match[2]}, ${match[3]}, ${alpha})` : color;
}

/** The colours every chart has: grid lines and text (axis titles, ticks, legend). */
export interface ChartInk {
  grid: string;
  text: string;
}

/**
 * A chart's colours read from the theme where the component stands: each name with its system colour
 * variable and a fallback, besides the grid and text that every chart has. Call it in a field initializer.
 */
export function chartColors<K extends string>(own: Record<K, readonly [variable: string, fallback: string]>): Record<K, string> & ChartInk {
  const host = inject<ElementRef<HTMLElement>>(ElementRef).nativeElement;
  const read = (variable: string, fallback: string) => themeColor(host, variable, fallback);
  const colors = {
    grid: read('--mat-sys-outline-variant', 'rgb(200, 200, 200)'),
    text: read('--mat-sys-on-surface', 'rgb(20, 20, 20)'),
  } as Record<K, string> & ChartInk;
  for (const [name, [variable, fallback]] of Object.entries(own) as [K, readonly [string, string]][]) {
    (colors as Record<K, string>)[name] = read(variable, fallback);
  }
  return colors;
}

/** A linear axis with its title, in the theme's ink; `more` adds to or overrides what it sets. */
export function linearAxis(title: string, ink: ChartInk, more: ScaleOptions<'linear'> = {}): ScaleOptions<'linear'> {
  return {
    type: 'linear',
    ...more,
    title: { display: true, text: title, color: ink.text, ...more.title },
    grid: { color: ink.grid, ...more.grid },
    ticks: { color: ink.text, ...more.ticks },
  };
}

/**
 * Options every Qwell chart shares: fills its box, draws at once (no animation), reads points as given
 * (parsing off: data are already `{ x, y }`), legend text in the theme's ink. `more` adds scales, tooltips, etc.
 */
export function lineChartOptions(ink: ChartInk, more: ChartOptions<'line'>): ChartOptions<'line'> {
  return {
    responsive: true,
    maintainAspectRatio: false,
    animation: false,
    parsing: false,
    ...more,
    plugins: {
      ...more.plugins,
      legend: { ...more.plugins?.legend, labels: { color: ink.text, ...more.plugins?.legend?.labels } },
    },
  };
}
