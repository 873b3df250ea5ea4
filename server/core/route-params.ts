import { notFound } from './problem';

/** A numeric id from the path; anything else is a route that does not exist. */
/** Largest id PostgreSQL's integer column holds: a larger one could be stored inside JSON but never looked up. */
export const MAX_RECORD_ID = 2_147_483_647;

/** Whether a value from a body can be a record's id: a whole number from 1 to MAX_RECORD_ID. */
export function isRecordId(value: unknown): value is number {
  return Number.isInteger(value) && (value as number) >= 1 && (value as number) <= MAX_RECORD_ID;
}

export function idParam(value: string | string[] | undefined, what = 'record'): number {
  const id = typeof value === 'string' && /^[1-9]\d{0,9}$/.test(value) ? Number(value) : NaN;
  if (!Number.isSafeInteger(id) || id > MAX_RECORD_ID) throw notFound(`There is no ${what} with id ${JSON.stringify(value)}.`);
  return id;
}
