import type { Role } from '../roles';

/** One of the person's work queues, with how many items wait in it. */
export interface HomeQueue {
  /** Stable code, e.g. `my-drafts`; picks the icon. */
  key: string;
  /** Shown as the tile's title. */
  label: string;
  /** Items waiting. */
  count: number;
  /** Router path of the page that lists them. */
  link: string;
  /** Filters for that page, e.g. `{ state: 'draft' }`. */
  queryParams?: Record<string, string>;
}

/** `GET /api/home`. */
export interface HomeSummary {
  role: Role;
  queues: HomeQueue[];
}
