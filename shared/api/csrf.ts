/**
 * The request header every state-changing API call from a signed-in browser carries. A page on
 * another site cannot add a custom header to a cross-site request without the server's CORS
 * consent (which Tailroom never gives), so its presence proves the request came from Tailroom's own
 * pages (OWASP CSRF Prevention Cheat Sheet, "custom request headers"), on top of SameSite cookies.
 */
export const CSRF_HEADER = 'X-Requested-With';
export const CSRF_HEADER_VALUE = 'tailroom';
