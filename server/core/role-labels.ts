import type { Role } from '../../db/schema';

/** A role as people name it (the client's ROLE_LABELS say the same). */
export const ROLE_LABELS: Readonly<Record<Role, string>> = {
  technician: 'Technician',
  assistant: 'Student assistant',
  investigator: 'Principal investigator',
  quality: 'Quality officer',
  admin: 'Administrator',
};

/** "a technician", "an administrator": the role in a sentence. */
export function roleWithArticle(role: Role): string {
  const label = ROLE_LABELS[role].toLowerCase();
  return `${/^[aeiou]/.test(label) ? 'an' : 'a'} ${label}`;
}
