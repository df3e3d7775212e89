import { HttpErrorResponse, type HttpInterceptorFn } from '@angular/common/http';
import { inject } from '@angular/core';
import { Router } from '@angular/router';
import { catchError, throwError } from 'rxjs';
import { safeReturnUrl } from '../core/api-errors';
import { AuthStore } from './auth-store';

/** Requests whose 401 is an answer, not a sign that the session ended. */
function isExempt(url: string): boolean {
  const path = url.replace(/^https?:\/\/[^/]+/, '').split(/[?#]/)[0] ?? '';
  return path.startsWith('/api/v1/auth/') || path === '/api/v1/session';
}

/** A 401 from the API means the session ended: forget the user and ask them to sign in again. */
export const sessionExpiredInterceptor: HttpInterceptorFn = (req, next) => {
  const router = inject(Router);
  const auth = inject(AuthStore);
  return next(req).pipe(
    catchError((err: unknown) => {
      if (err instanceof HttpErrorResponse && err.status === 401 && !isExempt(req.url)) {
        auth.markSignedOut();
        const returnUrl = safeReturnUrl(router.url);
        void router.navigate(['/sign-in'], returnUrl ? { queryParams: { returnUrl } } : {});
      }
      return throwError(() => err);
    }),
  );
};
