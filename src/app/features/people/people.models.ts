import { Role } from '../../core/auth/auth.models';

/** One row of `GET /api/people` (administrators only). */
export interface PersonRecord {
  id: number;
  email: string;
  name: string;
  role: Role;
  /** false once the account has been switched off; history stays. */
  active: boolean;
  /** ISO timestamp until which sign-in is refused after failed attempts; null when not locked. */
  lockedUntil: string | null;
}

export interface PeopleList {
  items: PersonRecord[];
}
