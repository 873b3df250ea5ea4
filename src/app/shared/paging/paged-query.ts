import { Params } from '@angular/router';

/** Query parameters for a list's address: values equal to the defaults are left out to keep links short. */
export function addressParams<T extends object>(next: T, defaults: T): Params {
  const params: Params = {};
  for (const key of Object.keys(next) as (keyof T & string)[]) {
    params[key] = next[key] === defaults[key] ? null : next[key];
  }
  return params;
}

/** What a screen reader hears when a page of a list arrives, e.g. "Runs 26 to 50 of 112 shown." */
export function pageRangeMessage(page: { total: number; page: number; pageSize: number }, plural: string): string {
  if (page.total === 0) return `No ${plural.toLowerCase()} match.`;
  const first = (page.page - 1) * page.pageSize + 1;
  const last = Math.min(page.page * page.pageSize, page.total);
  return `${plural} ${first} to ${last} of ${page.total} shown.`;
}
