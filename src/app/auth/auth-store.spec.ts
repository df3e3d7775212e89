import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { OTHER_ORG_ID, signedInSession, signedOutSession } from '../testing/test-sessions';
import { AuthStore } from './auth-store';

const TOKEN = 'abcdefghijklmnopqrstuvwxyz012345';

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
  it('signUp() answers what the server said and leaves the visitor signed out', async () => {
    store.setSession(signedOutSession());
    const started = store.signUp({ email: 'dana@example.com', name: 'Dana Frost', returnUrl: '/team' });
    const req = http.expectOne({ method: 'POST', url: '/api/v1/auth/sign-up' });
    expect(req.request.body).toEqual({ email: 'dana@example.com', name: 'Dana Frost', returnUrl: '/team' });
    req.flush({ email: 'dana@example.com', message: 'Check your e-mail' }, { status: 202, statusText: 'Accepted' });
    expect(await started).toEqual({ email: 'dana@example.com', message: 'Check your e-mail' });
    expect(store.signedIn()).toBeFalse();
    expect(store.session()).toEqual(signedOutSession());
  });

  it('signUp() rejects an answer that is not the expected shape', async () => {
    const started = store.signUp({ email: 'dana@example.com', name: 'Dana Frost' });
    http.expectOne('/api/v1/auth/sign-up').flush({ ok: true }, { status: 202, statusText: 'Accepted' });
    await expectAsync(started).toBeRejected();
  });

  it('finishSignUp() sends the password to the link and signs in with the answered session', async () => {
    store.setSession(signedOutSession());
    const finishing = store.finishSignUp(TOKEN, 'a long enough passphrase');
    const req = http.expectOne({ method: 'POST', url: `/api/v1/auth/sign-ups/${TOKEN}` });
    expect(req.request.body).toEqual({ password: 'a long enough passphrase' });
    req.flush(signedInSession('owner'), { status: 201, statusText: 'Created' });
    const session = await finishing;
    expect(session.user?.email).toBe('dana@example.com');
    expect(store.signedIn()).toBeTrue();
    expect(store.currentRole()).toBe('owner');
  });

  it('finishSignUp() keeps the visitor signed out when the link is refused', async () => {
    store.setSession(signedOutSession());
    const finishing = store.finishSignUp(TOKEN, 'a long enough passphrase');
    http
      .expectOne(`/api/v1/auth/sign-ups/${TOKEN}`)
      .flush(
        { error: { code: 'invalid_sign_up_link', message: 'This link has expired or was already used' } },
        { status: 400, statusText: 'Bad Request' },
      );
    await expectAsync(finishing).toBeRejected();
    expect(store.signedIn()).toBeFalse();
  });

  it('createInvitedAccount() makes the account behind the invitation and signs in', async () => {
    store.setSession(signedOutSession());
    const creating = store.createInvitedAccount(TOKEN, { name: 'Dana Frost', password: 'a long enough passphrase' });
    const req = http.expectOne({ method: 'POST', url: `/api/v1/invitation-links/${TOKEN}/account` });
    expect(req.request.body).toEqual({ name: 'Dana Frost', password: 'a long enough passphrase' });
    req.flush(signedInSession('designer'), { status: 201, statusText: 'Created' });
    await creating;
    expect(store.user()?.name).toBe('Dana Frost');
    expect(store.currentRole()).toBe('designer');
  });
});
