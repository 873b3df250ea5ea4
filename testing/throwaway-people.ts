import bcrypt from 'bcryptjs';
import type { Database } from '../db/client';
import { people, projectMembers, type Role } from '../db/schema';

export const THROWAWAY_PASSWORD = 'throwaway-password-1';

/** A person made for one test (cheap bcrypt cost: these tests count attempts, they do not time them). */
export async function makeThrowawayPerson(db: Database, tag: string, role: Role = 'technician', projectIds: number[] = []) {
  const email = `${tag}-${Date.now()}-${Math.random().toString(36).slice(2, 8)}@spec.test`;
  const [row] = await db.insert(people)
    .values({ email, name: `Spec ${tag}`, role, passwordHash: await bcrypt.hash(THROWAWAY_PASSWORD, 4) })
    .returning();
  if (projectIds.length) await db.insert(projectMembers).values(projectIds.map((projectId) => ({ projectId, personId: row.id })));
  return { ...row, password: THROWAWAY_PASSWORD };
}
