import { inject } from '@angular/core';
import { Router, type CanActivateFn } from '@angular/router';
import { can, type Action } from '@shared/auth/roles';
import { AuthStore } from './auth-store';

/** Lets through a signed-in user whose role in the current organisation allows `action`. */
export function roleGuard(action: Action): CanActivateFn {
  return async (_route, state) => {
    const auth = inject(AuthStore);
    const router = inject(Router);
    const session = await auth.whenLoaded();
    if (!session.user) {
      return router.createUrlTree(['/sign-in'], { queryParams: { returnUrl: state.url } });
    }
    const role = session.organizations.find((o) => o.id === session.currentOrganizationId)?.role;
    return can(role, action) || router.createUrlTree(['/forbidden']);
  };
}
