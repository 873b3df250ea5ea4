import type { TemperatureRise } from '../calorimetry.models';
import { riseOverlay } from './rise-overlay';

// A rise whose drift lines are known: fore-drift +0.1 mK/s through (150 s, 298.000 K), after-drift −0.2 mK/s through
// (1500 s, 300.500 K), Dickinson's time b = 700 s.
const rise: TemperatureRise = {
  observed: 2.5,
  corrected: { value: 2.48734, u: 0.00123 },
  method: 'regnault-pfaundler',
  alternative: { value: 2.4869, u: 0.0013, method: 'dickinson' },
  periods: { source: 'detected', mainStart: 300, mainEnd: 1200, startReading: 31, endReading: 121, foreReadings: 31, afterReadings: 60, dickinsonTime: 700 },
  drift: {
    fore: { rate: 1e-4, u: 1e-6, meanTemperature: 298, meanTime: 150, readings: 31 },
    after: { rate: -2e-4, u: 1e-6, meanTemperature: 300.5, meanTime: 1500, readings: 60 },
  },
};

describe('the corrected rise drawn on the temperature chart', () => {
  const o = riseOverlay([0, 10, 1790, 1800], rise);

  it('shades the fore-, main and after-period at the result\'s period boundaries', () => {
    expect(o.bands).toEqual([
      { from: 0, to: 300, label: 'fore-period', main: false },
      { from: 300, to: 1200, label: 'main period', main: true },
      { from: 1200, to: 1800, label: 'after-period', main: false },
    ]);
  });

  it('extends the fitted drift lines to Dickinson\'s time b and joins them there with the rise segment', () => {
    // fore line: 298 + 1e-4·(t − 150); after line: 300.5 − 2e-4·(t − 1500) (straight-line arithmetic)
    expect(o.foreLine[0]).toEqual({ x: 0, y: 298 - 0.015 });
    expect(o.foreLine[1].x).toBe(700);
    expect(o.foreLine[1].y).toBeCloseTo(298.055, 12);
    expect(o.afterLine[0].y).toBeCloseTo(300.66, 12);
    expect(o.afterLine[1]).toEqual({ x: 1800, y: 300.5 - 0.06 });
    expect(o.riseSegment).toEqual([o.foreLine[1], o.afterLine[0]]);
  });

  it('labels the corrected rise the run uses, u to two significant digits (GUM 7.2.6)', () => {
    expect(o.label).toEqual(['corrected rise', '2.4873 ± 0.0012 K']);
  });
});
