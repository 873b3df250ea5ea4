import { ValidateBy, ValidateIf, type ValidationOptions } from 'class-validator';
import { Transform } from 'class-transformer';

const DAY = /^(\d{4})-\d{2}-\d{2}$/;

/** A day that exists on the calendar, written YYYY-MM-DD, in the years 1900–2999 (2026-02-30 and 0202-03-14 are refused). */
export function isCalendarDay(value: unknown): boolean {
  if (typeof value !== 'string') return false;
  const match = DAY.exec(value);
  if (!match || Number(match[1]) < 1900 || Number(match[1]) > 2999) return false;
  const day = new Date(`${value}T00:00:00Z`);
  return !Number.isNaN(day.getTime()) && day.toISOString().slice(0, 10) === value;
}

export function IsCalendarDay(options?: ValidationOptions): PropertyDecorator {
  return ValidateBy({ name: 'isCalendarDay', validator: { validate: (value) => isCalendarDay(value) } }, options);
}

/** May be left out, but is checked when present, null included: for fields whose column cannot be empty. */
export function IsOptionalNotNull(): PropertyDecorator {
  return ValidateIf((_object, value) => value !== undefined);
}

/**
 * Trims text before the length check, so a value of spaces counts as empty (a title of spaces is
 * refused, not stored blank). Other types pass through for their own type check.
 */
export function Trimmed(): PropertyDecorator {
  return Transform(({ value }: { value: unknown }) => (typeof value === 'string' ? value.trim() : value));
}
