import type { Role } from '@contract';

// The roles and their names are the contract's (contract/roles.ts), shared with the server.
export { ROLES, ROLE_LABELS } from '@contract';
export type { Role } from '@contract';

/** The signed-in person, as `GET /api/auth/me` returns it. */
export interface Person {
  /** Database id. */
  id: number;
  /** Sign-in address. */
  email: string;
  /** Full name as the lab writes it. */
  name: string;
  /** What the person may see and do. */
  role: Role;
}

/** Body of `GET /api/auth/me` and `POST /api/auth/sign-in`. */
export interface PersonResponse {
  person: Person;
}
