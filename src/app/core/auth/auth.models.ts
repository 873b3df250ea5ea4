/** The five roles a person can hold in a Qwell lab. */
export type Role = 'technician' | 'assistant' | 'investigator' | 'quality' | 'admin';

export const ROLES: readonly Role[] = ['technician', 'assistant', 'investigator', 'quality', 'admin'];

/** Names shown to people; the codes stay in the API. */
export const ROLE_LABELS: Readonly<Record<Role, string>> = {
  technician: 'Technician',
  assistant: 'Student assistant',
  investigator: 'Principal investigator',
  quality: 'Quality officer',
  admin: 'Administrator',
};

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
