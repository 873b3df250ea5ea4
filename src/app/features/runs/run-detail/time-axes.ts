/** The heater-power axis: from 0 W to a round value just above the highest power, so the heater's level reads, not its noise. */
export function powerAxisRange(power: readonly number[]): { min: number; max: number } {
  let top = 0;
  for (const p of power) {
    if (Number.isFinite(p) && p > top) {
      top = p;
    }
  }
  if (top <= 0) {
    return { min: 0, max: 1 };
  }
  return { min: 0, max: niceCeiling(top * 1.1) };
}

/** The smallest of 1, 1.2, 1.5, 2, 2.5, 3, 4, 5, 6, 8, 10 × 10^k at or above x (x > 0). */
export function niceCeiling(x: number): number {
  const decade = 10 ** Math.floor(Math.log10(x));
  for (const step of [1, 1.2, 1.5, 2, 2.5, 3, 4, 5, 6, 8, 10]) {
    const candidate = step * decade;
    if (candidate >= x * (1 - 1e-12)) {
      return Number(candidate.toPrecision(12));
    }
  }
  return 10 * decade;
}
