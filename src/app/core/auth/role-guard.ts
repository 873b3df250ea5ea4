import { inject } from '@angular/core';
import { CanActivateFn, RedirectCommand, Router } from '@angular/router';

import { Auth } from './auth';
import { Role } from './auth.models';

/**
 * Lets through only the roles in `data.roles`. Everyone else sees the "not for your role" page
 * at the address they asked for, so the address bar still tells them what they tried.
 * Runs after authGuard, so the person is known.
 */
export const roleGuard: CanActivateFn = (route) => {
  const roles = (route.data['roles'] ?? []) as readonly Role[];
  const role = inject(Auth).role();
  if (role && roles.includes(role)) {
    return true;
  }
  const router = inject(Router);
  return new RedirectCommand(router.parseUrl('/forbidden'), { skipLocationChange: true });
};
