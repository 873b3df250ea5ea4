import { sql, type SQL } from 'drizzle-orm';
import { runs } from '../../db/schema';

/** Runs whose current balance result found readings above the vessel's rated pressure (a safety event). */
export function overPressureFilter(): SQL {
  return sql`EXISTS (SELECT 1 FROM balance_results b WHERE b.run_id = ${runs.id} AND b.current
    AND b.result -> 'flags' @> '[{"code": "ABOVE_RATED_PRESSURE"}]'::jsonb)`;
}
