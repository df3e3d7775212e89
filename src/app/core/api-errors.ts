import { HttpErrorResponse } from '@angular/common/http';
import type { AbstractControl, FormGroup } from '@angular/forms';
import type { ApiError, FieldIssue } from '@shared/api/api-error';

export type ApiErrorBody = ApiError['error'];

const NETWORK_MESSAGE = 'The server could not be reached. Check your connection and try again.';
const GENERIC_MESSAGE = 'Something went wrong. Please try again.';

function isRecord(value: unknown): value is Record<string, unknown> {
  return typeof value === 'object' && value !== null;
}

function isFieldIssue(value: unknown): value is FieldIssue {
  return isRecord(value) && typeof value['path'] === 'string' && typeof value['message'] === 'string';
}

/**
 * The `{ error: { code, message, details? } }` body of a failed API call, or null.
 * Checked by hand (same shape as `apiErrorSchema`) so the shell does not need zod to start.
 */
export function readApiError(err: unknown): ApiErrorBody | null {
  if (!(err instanceof HttpErrorResponse) || !isRecord(err.error)) return null;
  const body = err.error['error'];
  if (!isRecord(body) || typeof body['code'] !== 'string' || typeof body['message'] !== 'string') return null;
  const details = body['details'];
  if (details !== undefined && !(Array.isArray(details) && details.every(isFieldIssue))) return null;
  return { code: body['code'], message: body['message'], ...(details ? { details } : {}) };
}

/** The `code` of a failed API call ('' when the answer did not follow the API error shape). */
export function apiErrorCode(err: unknown): string {
  return readApiError(err)?.code ?? '';
}

/** A sentence to show for a failed API call. */
export function apiErrorMessage(err: unknown, fallback = GENERIC_MESSAGE): string {
  const body = readApiError(err);
  if (body) return body.message;
  if (err instanceof HttpErrorResponse && err.status === 0) return NETWORK_MESSAGE;
  return fallback;
}

/**
 * Puts each `details[].message` of a failed API call on the form control named by its `path`
 * (as a `server` validation error) and returns the message to show above the form.
 * Details whose path names no control are appended to the form-level message.
 */
export function applyApiErrors(form: FormGroup, err: unknown, fallback = GENERIC_MESSAGE): string {
  const body = readApiError(err);
  if (!body) return apiErrorMessage(err, fallback);
  const unplaced: string[] = [];
  for (const detail of body.details ?? []) {
    const control = detail.path ? form.get(detail.path) : null;
    if (control) {
      control.setErrors({ ...(control.errors ?? {}), server: detail.message });
      control.markAsTouched();
    } else if (detail.message !== body.message) {
      unplaced.push(detail.message);
    }
  }
  return [body.message, ...unplaced].join(' ');
}

/** Texts for the validation errors used in our forms; the first error present wins. */
export interface ErrorTexts {
  required?: string;
  email?: string;
  minlength?: string;
  maxlength?: string;
  mismatch?: string;
}

/** The message to show under a field for its current validation errors ('' when valid). */
export function fieldError(control: AbstractControl, texts: ErrorTexts = {}): string {
  const errors = control.errors;
  if (!errors) return '';
  const server: unknown = errors['server'];
  if (typeof server === 'string') return server;
  if (errors['required']) return texts.required ?? 'This field is required';
  if (errors['email']) return texts.email ?? 'Enter a valid e-mail address';
  const min = errors['minlength'] as { requiredLength: number } | undefined;
  if (min) return texts.minlength ?? `Use at least ${min.requiredLength} characters`;
  const max = errors['maxlength'] as { requiredLength: number } | undefined;
  if (max) return texts.maxlength ?? `Use at most ${max.requiredLength} characters`;
  if (errors['mismatch']) return texts.mismatch ?? 'The values do not match';
  return 'This value is not valid';
}

/** A path inside this app to return to after signing in, or null if `url` is not one. */
export function safeReturnUrl(url: string | null | undefined): string | null {
  if (!url || !url.startsWith('/') || url.startsWith('//') || url.startsWith('/\\')) return null;
  if (url.startsWith('/sign-in')) return null;
  return url;
}
