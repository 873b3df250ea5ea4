import { niceCeiling, powerAxisRange } from './time-axes';

describe('powerAxisRange: the heater-power axis shows the heater, not its noise', () => {
  it('a steady 20 W heater with ±0.02 W noise gets an axis from 0 W to 25 W', () => {
    // Invented demo readings; the old axis auto-scaled to 19.98–20.02 W, which drew the noise as a sawtooth.
    const range = powerAxisRange([19.98, 20.02, 20.01, 19.99, 20.0]);
    expect(range.min).toBe(0);
    expect(range.max).toBe(25);
    // the heater's level sits in the upper part of the axis
    expect(20 / range.max).toBeGreaterThan(0.6);
  });
  it('a heater switched off part of the run keeps 0 W on the axis', () => {
    expect(powerAxisRange([0, 0, 4.8, 5.1, 5, 0])).toEqual({ min: 0, max: 6 });
  });
  it('an unheated run (all zero) gets a small axis, not an empty one', () => {
    expect(powerAxisRange([0, 0, 0])).toEqual({ min: 0, max: 1 });
  });
  it('niceCeiling picks a round value at or above', () => {
    expect(niceCeiling(22)).toBe(25);
    expect(niceCeiling(0.33)).toBe(0.4);
    expect(niceCeiling(1500)).toBe(1500);
    expect(niceCeiling(151)).toBe(200);
  });
});
