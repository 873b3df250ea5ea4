import { asc } from 'drizzle-orm';
import type { Database } from '../../db/client';
import { gases } from '../../db/schema';
import type { GasList } from './gases-dto';

export class GasesService {
  constructor(private readonly db: Database) {}

  /** The gases a run may name, by code. */
  async list(): Promise<GasList> {
    return { items: await this.db.select().from(gases).orderBy(asc(gases.code)) };
  }
}
