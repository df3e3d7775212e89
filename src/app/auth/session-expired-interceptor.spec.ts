import { HttpClient, provideHttpClient, withInterceptors } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { provideRouter, Router } from '@angular/router';
import { firstValueFrom } from 'rxjs';
import { signedInSession } from '../testing/test-sessions';
import { AuthStore } from './auth-store';
import { sessionExpiredInterceptor } from './session-expired-interceptor';

describe('sessionExpiredInterceptor', () => {
  let http: HttpTestingController;
  let client: HttpClient;
  let navigate: jasmine.Spy;

  beforeEach(() => {
    TestBed.configureTestingModule({
      providers: [
        provideRouter([]),
        provideHttpClient(withInterceptors([sessionExpiredInterceptor])),
        provideHttpClientTesting(),
      ],
    });
    http = TestBed.inject(HttpTestingController);
    client = TestBed.inject(HttpClient);
    navigate = spyOn(TestBed.inject(Router), 'navigate').and.resolveTo(true);
    TestBed.inject(AuthStore).setSession(signedInSession('owner'));
  });
  afterEach(() => http.verify());

  const unauthorized = { error: { code: 'unauthenticated', message: 'Sign in to continue' } };

  it('sends the user to sign in when an API call answers 401', async () => {
    const call = firstValueFrom(client.get('/api/v1/projects'));
    http.expectOne('/api/v1/projects').flush(unauthorized, { status: 401, statusText: 'Unauthorized' });
    await expectAsync(call).toBeRejected();
    expect(navigate).toHaveBeenCalledTimes(1);
    expect(navigate.calls.mostRecent().args[0]).toEqual(['/sign-in']);
    expect(TestBed.inject(AuthStore).signedIn()).toBeFalse();
  });

  it('leaves a failed sign-in to the form', async () => {
    const call = firstValueFrom(client.post('/api/v1/auth/sign-in', {}));
    http.expectOne('/api/v1/auth/sign-in').flush(unauthorized, { status: 401, statusText: 'Unauthorized' });
    await expectAsync(call).toBeRejected();
    expect(navigate).not.toHaveBeenCalled();
    expect(TestBed.inject(AuthStore).signedIn()).toBeTrue();
  });

  it('ignores other errors', async () => {
    const call = firstValueFrom(client.get('/api/v1/members'));
    http.expectOne('/api/v1/members').flush(unauthorized, { status: 403, statusText: 'Forbidden' });
    await expectAsync(call).toBeRejected();
    expect(navigate).not.toHaveBeenCalled();
  });
});
