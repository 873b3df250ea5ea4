import { notFound } from './problem';

/** A numeric id from the path; anything else is a route that does not exist. */
export function idParam(value: string | string[] | undefined, what = 'record'): number {
  const id = typeof value === 'string' && /^[1-9]\d{0,9}$/.test(value) ? Number(value) : NaN;
  if (!Number.isSafeInteger(id) || id > 2_147_483_647) throw notFound(`There is no ${what} with id ${JSON.stringify(value)}.`);
  return id;
}
