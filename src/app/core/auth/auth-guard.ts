import { inject } from '@angular/core';
import { CanActivateFn, Router } from '@angular/router';
import { map } from 'rxjs';

import { Auth } from './auth';

/** Signed-out people go to sign-in, which brings them back to where they were heading. */
export const authGuard: CanActivateFn = (_route, state) => {
  const router = inject(Router);
  return inject(Auth)
    .restore()
    .pipe(
      map((person) =>
        person ? true : router.createUrlTree(['/sign-in'], { queryParams: { returnUrl: state.url } }),
      ),
    );
};

/** The sign-in page is pointless with a session: go home instead. */
export const signedOutGuard: CanActivateFn = () => {
  const router = inject(Router);
  return inject(Auth)
    .restore()
    .pipe(map((person) => (person ? router.createUrlTree(['/home']) : true)));
};
