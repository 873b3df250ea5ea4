import { RUN_AUTHORS } from '../../contract/roles';
import bcrypt from 'bcryptjs';
import { count, sql } from 'drizzle-orm';
import type { Database } from '../client';
import { apparatus, calibrations, gases, instruments, people, projectMembers, projects } from '../schema';
import { recordAudit } from '../../server/audit/audit-service';
import { addDays, todayIso } from '../../server/instruments/calibration-status';
import {
  DEMO_INSTITUTION, demoApparatus, demoCalibrations, demoEmail, demoGases, demoInstruments, demoPeople, demoProjects,
} from './demo-lab';
import { seedDemoRuns } from './demo-runs';
import { seedDemoStandardizations } from './demo-standardizations';

const SEED_LOCK = 7_004_312;

/** Loads the demo lab into an empty database, in one transaction. Returns false when people exist. */
export async function seedDemoLab(db: Database, password: string): Promise<boolean> {
  const today = todayIso();

  return db.transaction(async (tx) => {
    // Two starts at once must not both load the lab.
    await tx.execute(sql`SELECT pg_advisory_xact_lock(${SEED_LOCK})`);
    const [{ n }] = await tx.select({ n: count() }).from(people);
    if (n > 0) return false;
    const hash = await bcrypt.hash(password, 12);
    const persons = await tx
      .insert(people)
      .values(demoPeople.map((p) => ({ email: demoEmail(p.role), name: p.name, role: p.role, passwordHash: hash })))
      .returning();
    const byRole = Object.fromEntries(persons.map((p) => [p.role, p]));
    const projectRows = await tx.insert(projects).values(demoProjects).returning();
    await tx.insert(projectMembers).values(
      projectRows.flatMap((project) =>
        RUN_AUTHORS.map((role) => ({ projectId: project.id, personId: byRole[role].id })),
      ),
    );
    await tx.insert(gases).values(demoGases);
    const instrumentRows = await tx.insert(instruments).values(demoInstruments.map((i) => ({ ...i, spec: { ...i.spec } }))).returning();
    const byTag = Object.fromEntries(instrumentRows.map((i) => [i.tag, i]));
    await tx.insert(calibrations).values(
      demoCalibrations.map((c) => ({
        instrumentId: byTag[c.tag].id,
        calibratedOn: addDays(today, -c.ageDays),
        dueOn: addDays(today, c.validDays - c.ageDays),
        certificate: c.certificate,
        expandedUncertainty: c.U,
        coverageFactor: c.k,
        createdBy: byRole['quality'].id,
      })),
    );
    await tx.insert(apparatus).values(demoApparatus);
    await seedDemoRuns(tx, { byRole, projects: projectRows, today });
    await seedDemoStandardizations(tx, { byRole, projects: projectRows, today }, DEMO_INSTITUTION);
    await recordAudit(tx, {
      action: 'seed.demo-lab',
      entityType: 'lab',
      entityId: 'demo',
      after: { institution: DEMO_INSTITUTION, people: persons.map((p) => p.email) },
      reason: 'demo lab loaded by npm start',
    });
    return true;
  });
}
