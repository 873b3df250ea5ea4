import { provideCharts } from 'ng2-charts';
import { Filler, Legend, LineController, LineElement, LinearScale, PointElement, Tooltip } from 'chart.js';

/** Only the chart.js parts the run page draws with; this file is imported by the lazy run page alone. */
export const RUN_CHARTS = provideCharts({
  registerables: [LineController, LineElement, PointElement, LinearScale, Filler, Legend, Tooltip],
});

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
