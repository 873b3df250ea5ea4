import { HttpErrorResponse, HttpInterceptorFn } from '@angular/common/http';
import { inject } from '@angular/core';
import { Router } from '@angular/router';
import { catchError, throwError } from 'rxjs';

import { Auth } from '../auth/auth';

/**
 * A 401 from any API call but the auth routes means the session ended (expired, or signed out in
 * another tab): drop the person and send them to sign-in, coming back here afterwards.
 * The error still reaches the caller, which shows nothing more once the page has changed.
 */
export const errorInterceptor: HttpInterceptorFn = (request, next) => {
  const auth = inject(Auth);
  const router = inject(Router);
  return next(request).pipe(
    catchError((error: unknown) => {
      if (
        error instanceof HttpErrorResponse &&
        error.status === 401 &&
        !request.url.startsWith('/api/auth/')
      ) {
        auth.forget();
        const here = router.url;
        if (!here.startsWith('/sign-in')) {
          void router.navigate(['/sign-in'], { queryParams: { returnUrl: here } });
        }
      }
      return throwError(() => error);
    }),
  );
};
