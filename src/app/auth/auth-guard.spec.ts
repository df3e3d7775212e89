import { TestBed } from '@angular/core/testing';
import { type ActivatedRouteSnapshot, provideRouter, Router, type RouterStateSnapshot, UrlTree } from '@angular/router';
import { signedInSession, signedOutSession } from '../testing/test-sessions';
import { authGuard } from './auth-guard';
import { AuthStore } from './auth-store';

const route = {} as ActivatedRouteSnapshot;
const state = (url: string) => ({ url }) as RouterStateSnapshot;

describe('authGuard', () => {
  beforeEach(() => {
    TestBed.configureTestingModule({ providers: [provideRouter([])] });
  });

  it('sends a signed-out visitor to /sign-in with the return URL', async () => {
    const store = TestBed.inject(AuthStore);
    store.setSession(signedOutSession());
    const result = await TestBed.runInInjectionContext(() => authGuard(route, state('/team?tab=1')));
    expect(result).toBeInstanceOf(UrlTree);
    const router = TestBed.inject(Router);
    expect(router.serializeUrl(result as UrlTree)).toBe('/sign-in?returnUrl=%2Fteam%3Ftab%3D1');
  });

  it('lets a signed-in user through', async () => {
    TestBed.inject(AuthStore).setSession(signedInSession('viewer'));
    const result = await TestBed.runInInjectionContext(() => authGuard(route, state('/projects')));
    expect(result).toBeTrue();
  });
});
