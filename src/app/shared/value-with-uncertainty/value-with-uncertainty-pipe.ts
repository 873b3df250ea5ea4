import { Pipe, PipeTransform } from '@angular/core';

/** A value and its expanded uncertainty, each as the digits to print. */
export interface RoundedValue {
  value: string;
  uncertainty: string;
}

const MINUS = '\u2212';
const THIN_SPACE = '\u202f';

/**
 * Rounds U to two significant digits and x to the same decimal place (GUM, JCGM 100:2008, 7.2.6:
 * "it usually suffices to quote uc(y) and U to at most two significant digits", with y rounded to match).
 * U = 0 (a term that is exactly zero, such as the heat of an adiabatic run) keeps x at six significant digits.
 */
export function roundToUncertainty(x: number, U: number): RoundedValue {
  if (!Number.isFinite(x)) {
    return { value: x > 0 ? '∞' : x < 0 ? `${MINUS}∞` : '—', uncertainty: '—' };
  }
  if (!Number.isFinite(U) || U < 0) {
    return { value: plain(x), uncertainty: '—' };
  }
  if (U === 0) {
    return { value: plain(x), uncertainty: '0' };
  }
  let exponent = Math.floor(Math.log10(U));
  // 0.0996 rounds to 0.100 at the third decimal: that is 0.10, two digits one place up.
  if (roundAt(U, exponent - 1) >= 10 ** (exponent + 1)) {
    exponent += 1;
  }
  const place = exponent - 1;
  return { value: digits(roundAt(x, place), place), uncertainty: digits(roundAt(U, place), place) };
}

/**
 * `x ± U unit (k = 2)`, rounded per GUM 7.2.6. With k = null the uncertainty is a standard uncertainty u
 * (a page that says so once) and no coverage factor is printed: `x ± u unit`.
 */
export function formatWithUncertainty(x: number, U: number, unit = '', k: number | null = 2): string {
  const { value, uncertainty } = roundToUncertainty(x, U);
  const withUnit = unit ? `${uncertainty} ${unit}` : uncertainty;
  return k === null ? `${value} ± ${withUnit}` : `${value} ± ${withUnit} (k = ${k})`;
}

/** Rounds x to a multiple of 10^place; toPrecision first so 0.1 + 0.2 style noise does not tip a half. */
function roundAt(x: number, place: number): number {
  const step = 10 ** place;
  const scaled = Number((x / step).toPrecision(12));
  return Math.round(scaled) * step;
}

function digits(x: number, place: number): string {
  const text = Math.abs(x).toFixed(Math.max(0, -place));
  const zero = Number(text) === 0;
  return `${x < 0 && !zero ? MINUS : ''}${group(text)}`;
}

function plain(x: number): string {
  const text = Math.abs(x) >= 1e-4 || x === 0 ? String(Number(Math.abs(x).toPrecision(6))) : Math.abs(x).toExponential(5);
  return `${x < 0 ? MINUS : ''}${text.includes('e') ? text : group(text)}`;
}

/** Groups the integer part in threes with a narrow space from five digits on (SI Brochure 5.4.4). */
function group(text: string): string {
  const [whole, fraction] = text.split('.');
  const grouped = whole.length > 4 ? whole.replace(/\B(?=(\d{3})+(?!\d))/g, THIN_SPACE) : whole;
  return fraction === undefined ? grouped : `${grouped}.${fraction}`;
}

/** `{{ x | withUncertainty: U : 'J' }}` → `−60.50 ± 0.30 J (k = 2)`; `{{ h | withUncertainty: u : 'W/K' : null }}` → `0.12108 ± 0.00023 W/K`. */
@Pipe({ name: 'withUncertainty' })
export class WithUncertaintyPipe implements PipeTransform {
  transform(x: number | null | undefined, U: number | null | undefined, unit = '', k: number | null = 2): string {
    if (x === null || x === undefined || U === null || U === undefined) {
      return '—';
    }
    return formatWithUncertainty(x, U, unit, k);
  }
}
