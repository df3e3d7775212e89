import { inject } from '@angular/core';
import { Router, type CanActivateFn } from '@angular/router';
import { AuthStore } from './auth-store';

/** Lets signed-in users through; sends everyone else to sign in, then back here. */
export const authGuard: CanActivateFn = async (_route, state) => {
  const auth = inject(AuthStore); // inject() before the first await
  const router = inject(Router);
  const session = await auth.whenLoaded();
  if (session.user) return true;
  return router.createUrlTree(['/sign-in'], { queryParams: { returnUrl: state.url } });
};
