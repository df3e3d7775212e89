import { inject } from '@angular/core';
import { Router, type CanActivateFn } from '@angular/router';
import { AuthStore } from './auth-store';

/** Pages for signed-out visitors only (sign in, create account …); signed-in users go to Projects. */
export const guestGuard: CanActivateFn = async () => {
  const auth = inject(AuthStore);
  const router = inject(Router);
  const session = await auth.whenLoaded();
  return session.user ? router.createUrlTree(['/projects']) : true;
};
