import { Component } from '@angular/core';
import { TestBed } from '@angular/core/testing';

import { ChartInk, chartColors, lineChartOptions, linearAxis, withAlpha } from './chart-theme';

const ink: ChartInk = { grid: 'rgb(200, 200, 200)', text: 'rgb(20, 20, 20)' };

describe('chart theme', () => {
  it('gives a colour an alpha for fills, and leaves a colour it cannot read as it is', () => {
    expect(withAlpha('rgb(14, 92, 99)', 0.3)).toBe('rgba(14, 92, 99, 0.3)');
    expect(withAlpha('rgba(14, 92, 99, 1)', 0.08)).toBe('rgba(14, 92, 99, 0.08)');
    expect(withAlpha('teal', 0.3)).toBe('teal');
  });

  it("reads each chart's colours where it stands, with the grid and text every chart has", () => {
    @Component({ selector: 'qw-probe-chart', template: '' })
    class ProbeChart {
      readonly colors = chartColors({ bars: ['--probe-bars', 'rgb(1, 2, 3)'] });
    }
    const fixture = TestBed.createComponent(ProbeChart);
    const colors = fixture.componentInstance.colors;
    // jsdom leaves var() unresolved (a browser gives plain rgb()): what it hands back shows which variable and fallback each name read.
    expect(colors).toEqual({
      bars: 'var(--probe-bars, rgb(1, 2, 3))',
      grid: 'var(--mat-sys-outline-variant, rgb(200, 200, 200))',
      text: 'var(--mat-sys-on-surface, rgb(20, 20, 20))',
    });
    // The probes are removed again.
    expect((fixture.nativeElement as HTMLElement).children).toHaveLength(0);
  });

  it('titles a linear axis in the ink, keeping what the chart adds to title, grid and ticks', () => {
    const axis = linearAxis('Time (s)', ink, { min: 0, grid: { drawOnChartArea: false }, ticks: { stepSize: 1 } });
    expect(axis).toEqual({
      type: 'linear',
      min: 0,
      title: { display: true, text: 'Time (s)', color: ink.text },
      grid: { color: ink.grid, drawOnChartArea: false },
      ticks: { color: ink.text, stepSize: 1 },
    });
  });

  it('draws at once from points as given, and keeps the legend in the ink beside the chart’s own label options', () => {
    const filter = () => true;
    const options = lineChartOptions(ink, {
      interaction: { mode: 'nearest', intersect: false },
      plugins: { legend: { labels: { filter } }, tooltip: { enabled: false } },
    });
    expect(options).toMatchObject({ responsive: true, maintainAspectRatio: false, animation: false, parsing: false });
    expect(options.interaction).toEqual({ mode: 'nearest', intersect: false });
    expect(options.plugins?.legend?.labels).toEqual({ color: ink.text, filter });
    expect(options.plugins?.tooltip).toEqual({ enabled: false });
  });
});
