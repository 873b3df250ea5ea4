import { AUDIT_READERS, ROLES, RUN_AUTHORS, RUN_READERS } from '@contract';

import { Role } from '../auth/auth.models';

/** One entry of the side navigation. */
export interface NavEntry {
  /** Absolute router path. */
  path: string;
  /** Text of the link. */
  label: string;
  /** Material Symbols (outlined) ligature name. */
  icon: string;
  /** Roles that see the entry and may open the page. */
  roles: readonly Role[];
}

const EVERYONE: readonly Role[] = ROLES;

/**
 * The one table of pages and who may open them: the side navigation is filtered from it, and
 * app.routes.ts reads its roles for the role guard, so a link and its page never disagree.
 */
export const NAVIGATION = {
  home: { path: '/home', label: 'Home', icon: 'home', roles: EVERYONE },
  runs: {
    path: '/runs',
    label: 'Runs',
    icon: 'science',
    roles: RUN_READERS,
  },
  newRun: { path: '/runs/new', label: 'New run', icon: 'edit_note', roles: RUN_AUTHORS },
  imports: { path: '/imports', label: 'Import', icon: 'upload_file', roles: RUN_AUTHORS },
  instruments: { path: '/instruments', label: 'Instruments', icon: 'speed', roles: EVERYONE },
  apparatus: { path: '/apparatus', label: 'Apparatus', icon: 'propane_tank', roles: EVERYONE },
  gases: { path: '/gases', label: 'Gases', icon: 'bubble_chart', roles: EVERYONE },
  audit: { path: '/audit', label: 'Audit trail', icon: 'policy', roles: AUDIT_READERS },
  people: { path: '/people', label: 'People', icon: 'group', roles: ['admin'] },
  projects: { path: '/projects', label: 'Projects', icon: 'folder_shared', roles: ['admin'] },
} as const satisfies Record<string, NavEntry>;

/** The entries a role sees, in table order. */
export function navigationFor(role: Role | null): NavEntry[] {
  if (!role) {
    return [];
  }
  return Object.values(NAVIGATION).filter((entry) => (entry.roles as readonly Role[]).includes(role));
}
