import { HttpErrorResponse } from '@angular/common/http';
import { FormControl, FormGroup } from '@angular/forms';
import { apiErrorMessage, applyApiErrors, safeReturnUrl, saveFailure } from './api-errors';

function failure(status: number, body: unknown): HttpErrorResponse {
  return new HttpErrorResponse({ status, error: body, url: '/api/v1/x' });
}

describe('api errors', () => {
  it('maps details onto the named controls and returns the message', () => {
    const form = new FormGroup({ email: new FormControl(''), name: new FormControl('') });
    const message = applyApiErrors(
      form,
      failure(400, {
        error: {
          code: 'invalid_input',
          message: 'Some fields are not valid',
          details: [
            { path: 'email', message: 'Enter a valid e-mail address' },
            { path: 'colour', message: 'Unknown field colour' },
          ],
        },
      }),
    );
    expect(form.controls.email.errors).toEqual({ server: 'Enter a valid e-mail address' });
    expect(form.controls.name.errors).toBeNull();
    expect(message).toBe('Some fields are not valid Unknown field colour');
  });

  it('falls back when the answer is not the API error shape', () => {
    expect(apiErrorMessage(failure(502, '<html>Bad gateway</html>'), 'Try later')).toBe('Try later');
    expect(apiErrorMessage(failure(0, null))).toContain('could not be reached');
  });

  it('accepts only paths inside the app as return URLs', () => {
    expect(safeReturnUrl('/team')).toBe('/team');
    expect(safeReturnUrl('//elsewhere.example')).toBeNull();
    expect(safeReturnUrl('https://elsewhere.example/')).toBeNull();
    expect(safeReturnUrl('/sign-in?returnUrl=%2Fteam')).toBeNull();
  });

  it('tells a stale save (someone saved first) from other failures, which go to the field placer', () => {
    const placer = jasmine.createSpy('placer').and.returnValue('Check the fields');
    const stale = failure(409, { error: { code: 'stale_update', message: 'Ann saved this after you opened it', details: [] } });
    expect(saveFailure(stale, placer)).toEqual({ stale: true, message: 'Ann saved this after you opened it' });
    expect(placer).not.toHaveBeenCalled();
    const invalid = failure(400, { error: { code: 'invalid_input', message: 'x', details: [{ path: 'name', message: 'y' }] } });
    expect(saveFailure(invalid, placer)).toEqual({ stale: false, message: 'Check the fields' });
    expect(placer).toHaveBeenCalledOnceWith(invalid);
  });
});
