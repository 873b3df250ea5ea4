import { inArray } from 'drizzle-orm';
import type { DbOrTx } from '../../db/client';
import { instruments } from '../../db/schema';
import { badRequest } from '../core/problem';

/** A channel bound to a register instrument, and the body field that names it. */
export interface NamedInstrument {
  channel: string;
  id: number;
  field: string;
}

/**
 * The register instruments a run's channels name must exist: a channel bound to no instrument would be
 * checked without its instrument's uncertainty and certificate, and nobody would see why. One query for
 * all of them; a 400 naming each missing one's field.
 */
export async function checkRegisterInstruments(tx: DbOrTx, named: readonly NamedInstrument[]): Promise<void> {
  if (named.length === 0) return;
  const found = new Set((await tx.select({ id: instruments.id }).from(instruments).where(inArray(instruments.id, named.map((n) => n.id)))).map((r) => r.id));
  const missing = named.filter((n) => !found.has(n.id));
  if (missing.length) {
    throw badRequest(
      `There is no instrument with id ${[...new Set(missing.map((n) => n.id))].join(', ')} in the register; choose the ${missing.map((n) => n.channel).join(' and ')} instrument again.`,
      missing.map((n) => ({ field: n.field, message: `unknown instrument ${n.id}` })),
    );
  }
}
