import type { HttpInterceptorFn } from '@angular/common/http';
import { CSRF_HEADER, CSRF_HEADER_VALUE } from '@shared/api/csrf';

/** Marks the app's own API requests with the header the server requires of state-changing calls. */
export const csrfInterceptor: HttpInterceptorFn = (req, next) =>
  next(req.url.startsWith('/api/') ? req.clone({ setHeaders: { [CSRF_HEADER]: CSRF_HEADER_VALUE } }) : req);
