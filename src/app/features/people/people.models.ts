import { Role } from '../../core/auth/auth.models';

/** The server's floor for new passwords (ASVS 2.1.1). */
export const MIN_PASSWORD_LENGTH = 12;

/** One row of `GET /api/people` (administrators only). */
export interface PersonRecord {
  id: number;
  email: string;
  name: string;
  role: Role;
  /** false once the account has been deactivated; history stays. */
  active: boolean;
  /** ISO timestamp until which sign-in is refused after failed attempts; null when not locked. */
  lockedUntil: string | null;
  /** ISO timestamp the account was made. */
  createdAt?: string;
}

export interface PeopleList {
  items: PersonRecord[];
}

/** Body of `POST /api/people`. */
export interface NewPerson {
  email: string;
  name: string;
  role: Role;
  password: string;
}

/** Body of `PATCH /api/people/:id`: only the parts that change. */
export interface PersonChange {
  name?: string;
  role?: Role;
  active?: boolean;
  /** true clears a lockout. */
  unlock?: true;
  password?: string;
}
