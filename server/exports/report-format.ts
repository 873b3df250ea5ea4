// Numbers as a printed report states them.

/**
 * x ± U with U rounded to two significant digits and x rounded to the same decimal place
 * (GUM, JCGM 100:2008, 7.2.6: "it usually suffices to quote uc(y) and U … to at most two significant
 * digits"; 7.2.6 also has the estimate rounded to be consistent with the uncertainty).
 */
export function formatMeasurement(x: number, U: number, unit = ''): string {
  const suffix = unit ? ` ${unit}` : '';
  if (!Number.isFinite(x)) return 'not defined';
  if (!Number.isFinite(U) || U <= 0) return `${Number(x.toPrecision(6))}${suffix} (no uncertainty)`;
  const U2 = Number(U.toPrecision(2));
  const decimals = 1 - Math.floor(Math.log10(U2));
  return `${roundTo(x, decimals)} ± ${roundTo(U2, decimals)}${suffix}`;
}

/** x rounded to `decimals` places (negative: to tens, hundreds …), printed without exponent. */
export function roundTo(x: number, decimals: number): string {
  if (decimals >= 0) {
    const s = x.toFixed(Math.min(decimals, 20));
    return /^-0\.?0*$/.test(s) ? s.slice(1) : s;
  }
  const step = 10 ** -decimals;
  const v = Math.round(x / step) * step;
  return String(Object.is(v, -0) ? 0 : v);
}

/** A number with `digits` significant digits for tables (budget sensitivities and the like). */
export function sig(x: number | null | undefined, digits = 3): string {
  if (x === null || x === undefined || !Number.isFinite(x)) return '-';
  if (x === 0) return '0';
  const a = Math.abs(x);
  return a >= 1e-3 && a < 1e6 ? String(Number(x.toPrecision(digits))) : x.toExponential(digits - 1);
}

export function percent(share: number): string {
  return `${(share * 100).toFixed(share >= 0.1 ? 1 : 2)} %`;
}

export const verdictWords: Record<string, string> = {
  closes: 'The balance closes: the residual r lies within its expanded uncertainty U(r) (En at most 1).',
  breaks: 'The balance breaks: the residual r is larger than its expanded uncertainty U(r) (En greater than 1). Look at the flags and hints before the run is used.',
  indeterminate: 'Indeterminate: the expanded uncertainty of the residual is so wide that a closing balance would mean nothing; the budget shows which instruments dominate.',
};
