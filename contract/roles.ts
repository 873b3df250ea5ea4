// Who may do what, by role. The server's routes and the client's navigation both read these lists.

/** The five roles a person can hold in a Qwell lab. */
export const ROLES = ['technician', 'assistant', 'investigator', 'quality', 'admin'] as const;
export type Role = (typeof ROLES)[number];

/** Names shown to people; the codes stay in the API and the database. */
export const ROLE_LABELS: Readonly<Record<Role, string>> = {
  technician: 'Technician',
  assistant: 'Student assistant',
  investigator: 'Principal investigator',
  quality: 'Quality officer',
  admin: 'Administrator',
};

/** Roles that write runs: create, edit, submit, import readings and correct approved runs. */
export const RUN_AUTHORS = ['technician', 'assistant', 'investigator'] as const satisfies readonly Role[];

/** Roles that read runs, their results and reports (administrators manage people, not runs). */
export const RUN_READERS = ['technician', 'assistant', 'investigator', 'quality'] as const satisfies readonly Role[];

/** Roles that sign runs off (approve, return, reject). */
export const REVIEWERS = ['investigator'] as const satisfies readonly Role[];

/** Roles that import logger files into runs. */
export const IMPORTERS = RUN_AUTHORS;

/** Roles that read and export the audit trail. */
export const AUDIT_READERS = ['quality', 'investigator'] as const satisfies readonly Role[];

/** True when `role` is one of `group`; narrows the role. */
export function inRoleGroup<G extends readonly Role[]>(group: G, role: string | null | undefined): role is G[number] {
  return role != null && (group as readonly string[]).includes(role);
}
