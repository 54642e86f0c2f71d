/** The session cookie's names: the one cookie the app sets. */

/** Over plain HTTP (a local run). */
export const SESSION_COOKIE = 'longtail.sid';
/**
 * Over HTTPS: the `__Host-` prefix makes the browser take the cookie only when it is Secure, has
 * Path=/ and no Domain, so no other site (a sibling subdomain included) can set or replace it.
 */
export const SECURE_SESSION_COOKIE = '__Host-longtail.sid';
/** The session cookie's name for a request (HTTPS or not). */
export const sessionCookieName = (req: { secure: boolean }) => (req.secure ? SECURE_SESSION_COOKIE : SESSION_COOKIE);
