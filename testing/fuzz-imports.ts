import { eq } from 'drizzle-orm';
import type { Database } from '../db/client';
import { people } from '../db/schema';
import { importLimitsFromEnv } from '../server/imports/import-limits';
import { ImportsService } from '../server/imports/imports-service';
import { loadFixture } from './fixture-runs';

/**
 * The import routes' part of the fuzz table: the uploaded file they work on, and their valid bodies.
 * An import commits once, so the commit target gets a fresh copy of the upload before each payload
 * (made through the same service the upload route calls, as the throwaway technician).
 */

const fixture = loadFixture('isothermal');
const readings = fixture.readings as unknown as Record<string, { values: number[] }>;

/** The fixture's columns as a logger writes them: header text, channel, unit. */
const COLUMNS: Array<[header: string, channel: string, unit: string]> = [
  ['Time (s)', 'time', 's'], ['P (kPa)', 'pressure', 'kPa'], ['Piston position [mm]', 'displacement', 'mm'],
  ['T/°C', 'temperature', 'degC'], ['U/V', 'voltage', 'V'], ['Heater current (mA)', 'current', 'mA'],
];

export const FUZZ_IMPORT_HEADERS = COLUMNS.map(([header]) => header);

/** The isothermal fixture's readings as a logger's CSV export (201 rows). */
export function fuzzImportCsv(): Buffer {
  const n = readings['time'].values.length;
  const lines = [FUZZ_IMPORT_HEADERS.join(','), ...Array.from({ length: n }, (_, i) => COLUMNS.map(([, channel]) => readings[channel].values[i]).join(','))];
  return Buffer.from(`${lines.join('\n')}\n`, 'utf8');
}

/** The mapping of that file, with a register instrument on the pressure column. */
export function fuzzImportMapping(instrumentId: number) {
  return {
    time: { index: 0, unit: 's' },
    columns: COLUMNS.slice(1).map(([, channel, unit], k) => ({
      index: k + 1, channel, unit, ...(channel === 'pressure' ? { reference: 'absolute', instrumentId } : {}),
    })),
  };
}

/** A commit into a new draft of the fuzz project, with the setup an import may carry (gas, amount, ambient). */
export function fuzzImportCommit(ids: Record<string, number>) {
  return {
    mapping: fuzzImportMapping(ids[':instrument']),
    target: { newRun: { projectId: ids[':project'], title: 'Fuzz imported run', process: 'isothermal', runDate: '2026-05-04', setup: { gas: fixture.gas, amount: fixture.amount, ambient: fixture.ambient } } },
  };
}

/** Uploads the fixture's CSV as this person (the upload route's own service), answering the new import's id. */
export async function makeFuzzImport(db: Database, personId: number): Promise<number> {
  const [person] = await db.select({ id: people.id, email: people.email, name: people.name, role: people.role }).from(people).where(eq(people.id, personId));
  const preview = await new ImportsService(db, importLimitsFromEnv())
    .upload(person, { originalname: 'fuzz-logger.csv', mimetype: 'text/csv', buffer: fuzzImportCsv() }, {}, null);
  return preview.importId;
}
