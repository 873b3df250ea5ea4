import type { gases } from '../../db/schema';

/** One row of GET /api/gases; read-only, because the engine holds each gas's coefficients by code. */
export type GasRow = typeof gases.$inferSelect;

/** GET /api/gases */
export interface GasList {
  items: GasRow[];
}
