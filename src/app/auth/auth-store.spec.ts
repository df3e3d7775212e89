import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { OTHER_ORG_ID, signedInSession, signedOutSession } from '../testing/test-sessions';
import { AuthStore } from './auth-store';

describe('AuthStore', () => {
  let store: AuthStore;
  let http: HttpTestingController;

  beforeEach(() => {
    TestBed.configureTestingModule({ providers: [provideHttpClient(), provideHttpClientTesting()] });
    store = TestBed.inject(AuthStore);
    http = TestBed.inject(HttpTestingController);
  });
  afterEach(() => http.verify());

  it('can() follows the role in the current organisation', () => {
    store.setSession(signedInSession('owner'));
    expect(store.can('member:manage')).toBeTrue();
    expect(store.can('project:write')).toBeTrue();

    store.setSession(signedInSession('designer'));
    expect(store.can('project:write')).toBeTrue();
    expect(store.can('member:manage')).toBeFalse();

    store.setSession(signedInSession('viewer'));
    expect(store.currentRole()).toBe('viewer');
    expect(store.can('org:read')).toBeTrue();
    expect(store.can('project:write')).toBeFalse();
  });

  it('can() is false for everything when signed out', () => {
    store.setSession(signedOutSession());
    expect(store.can('org:read')).toBeFalse();
  });

  it('whenLoaded() asks the server once and shares the answer', async () => {
    const first = store.whenLoaded();
    const second = store.whenLoaded();
    http.expectOne({ method: 'GET', url: '/api/v1/session' }).flush(signedInSession('designer'));
    const [a, b] = await Promise.all([first, second]);
    expect(a.user?.email).toBe('dana@example.com');
    expect(b).toBe(a);
    expect(store.currentOrganization()?.name).toBe('Frost Heating');
    await store.whenLoaded();
    http.expectNone('/api/v1/session');
  });

  it('switchOrganization() stores the session the server answers', async () => {
    store.setSession(signedInSession('owner'));
    const switching = store.switchOrganization(OTHER_ORG_ID);
    const req = http.expectOne({ method: 'PUT', url: '/api/v1/session/organization' });
    expect(req.request.body).toEqual({ organizationId: OTHER_ORG_ID });
    req.flush({ ...signedInSession('owner'), currentOrganizationId: OTHER_ORG_ID });
    await switching;
    expect(store.currentRole()).toBe('viewer');
    expect(store.can('project:write')).toBeFalse();
  });
});
