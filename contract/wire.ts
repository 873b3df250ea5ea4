/**
 * What a server handler may hand to `res.json()` for a response of type T: where T has a string
 * (a timestamp on the wire), the server may hold a Date, which JSON writes as its ISO 8601 string.
 * Server code annotates its results with `Wire<T>` so the compiler checks them against the contract.
 */
export type Wire<T> = T extends string
  ? T | Date
  : T extends readonly (infer U)[]
    ? readonly Wire<U>[]
    : T extends object
      ? { [K in keyof T]: Wire<T[K]> }
      : T;

/** `{ items }`: the shape of every unpaged list the API returns. */
export interface ItemList<T> {
  items: T[];
}

/** A value with its standard uncertainty, in the same unit. */
export interface ValueU {
  value: number;
  u: number;
}
