import { TestBed } from '@angular/core/testing';
import { type ActivatedRouteSnapshot, provideRouter, Router, type RouterStateSnapshot, UrlTree } from '@angular/router';
import { signedInSession, signedOutSession } from '../testing/test-sessions';
import { AuthStore } from './auth-store';
import { roleGuard } from './role-guard';

const route = {} as ActivatedRouteSnapshot;
const state = (url: string) => ({ url }) as RouterStateSnapshot;

describe('roleGuard', () => {
  beforeEach(() => {
    TestBed.configureTestingModule({ providers: [provideRouter([])] });
  });

  it('sends a viewer away from member management to /forbidden', async () => {
    TestBed.inject(AuthStore).setSession(signedInSession('viewer'));
    const result = await TestBed.runInInjectionContext(() => roleGuard('member:manage')(route, state('/team')));
    expect(result).toBeInstanceOf(UrlTree);
    expect(TestBed.inject(Router).serializeUrl(result as UrlTree)).toBe('/forbidden');
  });

  it('lets an owner manage members', async () => {
    TestBed.inject(AuthStore).setSession(signedInSession('owner'));
    const result = await TestBed.runInInjectionContext(() => roleGuard('member:manage')(route, state('/team')));
    expect(result).toBeTrue();
  });

  it('sends a signed-out visitor to sign in first', async () => {
    TestBed.inject(AuthStore).setSession(signedOutSession());
    const result = await TestBed.runInInjectionContext(() => roleGuard('project:write')(route, state('/projects')));
    expect(TestBed.inject(Router).serializeUrl(result as UrlTree)).toBe('/sign-in?returnUrl=%2Fprojects');
  });
});
