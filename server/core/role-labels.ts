import { ROLE_LABELS, type Role } from '../../contract/roles';

export { ROLE_LABELS };

/** "a technician", "an administrator": the role in a sentence. */
export function roleWithArticle(role: Role): string {
  const label = ROLE_LABELS[role].toLowerCase();
  return `${/^[aeiou]/.test(label) ? 'an' : 'a'} ${label}`;
}
