import { boolean, index, integer, pgEnum, pgTable, primaryKey, serial, text, timestamp } from 'drizzle-orm/pg-core';
import { ROLES, type Role } from '../../contract/roles';

export const roles = ROLES;
export type { Role };
export const roleEnum = pgEnum('role', roles);

/** A person who signs in. Passwords are bcrypt hashes; lockout state lives beside them. */
export const people = pgTable('people', {
  id: serial('id').primaryKey(),
  /** Sign-in address, stored lower-case. */
  email: text('email').notNull().unique(),
  name: text('name').notNull(),
  role: roleEnum('role').notNull(),
  passwordHash: text('password_hash').notNull(),
  /** Consecutive failed sign-ins since the last success or lock. */
  failedAttempts: integer('failed_attempts').notNull().default(0),
  lockedUntil: timestamp('locked_until', { withTimezone: true }),
  /** Session tokens issued before this moment are refused (sign-out, deactivation, password change). */
  sessionsValidAfter: timestamp('sessions_valid_after', { withTimezone: true }),
  active: boolean('active').notNull().default(true),
  createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
});

export const projects = pgTable('projects', {
  id: serial('id').primaryKey(),
  code: text('code').notNull().unique(),
  name: text('name').notNull(),
  description: text('description').notNull().default(''),
  createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
});

/** Who works on a project; investigators review only the runs of their projects. */
export const projectMembers = pgTable(
  'project_members',
  {
    projectId: integer('project_id').notNull().references(() => projects.id, { onDelete: 'cascade' }),
    personId: integer('person_id').notNull().references(() => people.id, { onDelete: 'cascade' }),
  },
  (t) => [primaryKey({ columns: [t.projectId, t.personId] }), index('project_members_person_idx').on(t.personId)],
);
