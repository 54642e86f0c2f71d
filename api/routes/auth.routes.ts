/**
 * Sign-in, sign-out, who am I (and my own preferences and password), a new password through a
 * reset link, and the CSRF token.
 */
import { Router } from 'express';
import type { PassportStatic } from 'passport';
import type { DataSource } from 'typeorm';
import type { CsrfProtection } from '../auth/csrf';
import { signInAddressLimit, signInDelay } from '../auth/rate-limit';
import { accountKey, addressKey, type SignInThrottle } from '../auth/sign-in-throttle';
import { currentUser, requireSignIn } from '../auth/require';
import { sessionCookieName } from '../auth/session-cookie';
import { AppError } from '../errors';
import { changeOwnPassword, completePasswordReset, sessionUser, updatePreferences } from '../services/users.service';
import { LOGIN_BODY, PASSWORD_CHANGE_BODY, PASSWORD_RESET_BODY, PREFERENCES_BODY } from '../validation/bodies';
import { validateBody } from '../validation/validate-request';

export function authRoutes(passport: PassportStatic, dataSource: DataSource, throttle: SignInThrottle, csrf: CsrfProtection): Router {
  const router = Router();
  router.get('/csrf', csrf.issue);
  const emailOf = (req: { body?: { email?: unknown } }) => req.body?.email;
  router.post('/login', validateBody(LOGIN_BODY), signInAddressLimit(), signInDelay(throttle, emailOf), (req, res, next) => {
    const account = accountKey(emailOf(req));
    const address = addressKey(req.ip);
    passport.authenticate('local', (error: unknown, user: Express.User | false) => {
      if (error) return next(error);
      // One answer for an unknown account and a wrong password: no account enumeration.
      if (!user) {
        throttle.recordFailure(account, address);
        return next(new AppError('sign-in-failed', 401, 'Wrong e-mail address or password.'));
      }
      throttle.recordSuccess(account, address);
      // Told only to someone who knows the password: the account exists but may not sign in.
      if (user.disabledAt !== null) return next(new AppError('account-disabled', 403, 'This account is disabled: ask an administrator to enable it.'));
      // passport ≥ 0.6 regenerates the session here: no session fixation, and a new CSRF token.
      req.login(user, (loginError) => (loginError ? next(loginError) : res.json({ user, csrfToken: csrf.tokenOf(req) })));
    })(req, res, next);
  });
  router.post('/logout', (req, res, next) => {
    req.logout((error) => {
      if (error) return next(error);
      req.session.destroy(() => {
        res.clearCookie(sessionCookieName(req), { httpOnly: true, sameSite: 'lax', secure: req.secure, path: '/' });
        res.status(204).end();
      });
    });
  });
  router.get('/me', requireSignIn, (req, res) => {
    res.json({ user: req.user });
  });
  router.patch('/me', requireSignIn, validateBody(PREFERENCES_BODY), async (req, res) => {
    // The whole signed-in person, project roles included: the browser replaces its copy with it.
    res.json({ user: await sessionUser(dataSource, await updatePreferences(dataSource, currentUser(req).id, req.body)) });
  });
  // A wrong current password counts like a failed sign-in (a borrowed session cannot guess it fast).
  const ownEmail = (req: { user?: Express.User }) => req.user?.email;
  router.post('/password', requireSignIn, validateBody(PASSWORD_CHANGE_BODY), signInDelay(throttle, ownEmail), async (req, res) => {
    const user = currentUser(req);
    try {
      res.json(await changeOwnPassword(dataSource, user.id, req.sessionID, req.body));
    } catch (error) {
      if (error instanceof AppError && error.details.some((d) => d.path === '/currentPassword')) throttle.recordFailure(accountKey(user.email), addressKey(req.ip));
      throw error;
    }
  });
  router.post('/password-reset', validateBody(PASSWORD_RESET_BODY), signInAddressLimit(), async (req, res) => {
    res.json(await completePasswordReset(dataSource, req.body));
  });
  return router;
}
