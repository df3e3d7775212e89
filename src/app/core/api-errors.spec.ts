import { HttpErrorResponse } from '@angular/common/http';
import { FormControl, FormGroup } from '@angular/forms';
import { apiErrorMessage, applyApiErrors, safeReturnUrl } from './api-errors';

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
});
