import { Router, type Request, type Response } from 'express';
import type { Knex } from 'knex';
import passport from 'passport';
import {
  passwordResetConfirmSchema,
  passwordResetRequestSchema,
  finishSignUpSchema,
  signInInputSchema,
  signUpInputSchema,
  switchOrganizationSchema,
  updateMeSchema,
} from '@shared/auth/auth-schemas';
import type { Config } from '../../config';
import { currentUser, requireUser } from '../../http/authorize';
import { audit } from '../audit/audit-service';
import { HttpError } from '../../http/http-error';
import type { Mailer } from '../../mail/mailer';
import { roleOf } from '../orgs/orgs-service';
import * as accounts from './auth-service';
import { logIn, saveSession, sessionView, startSession } from './session-view';
import type { UserRecord } from './users-repo';

const INVALID_CREDENTIALS = new HttpError(
  401,
  'invalid_credentials',
  'That e-mail and password do not match an account',
);

function authenticateLocal(auth: passport.Authenticator, req: Request, res: Response): Promise<UserRecord | false> {
  return new Promise((resolve, reject) => {
    const handler = auth.authenticate('local', (err: unknown, user: UserRecord | false) => {
      if (err) reject(err instanceof Error ? err : new Error('authentication failed'));
      else resolve(user);
    }) as (req: Request, res: Response, next: (err?: unknown) => void) => void;
    handler(req, res, (err) => reject(err instanceof Error ? err : new Error(String(err))));
  });
}

export function authRouter(db: Knex, config: Config, mailer: Mailer, auth: passport.Authenticator): Router {
  const router = Router();
  const devOutbox = Boolean(config.devOutboxUrl);

  router.get('/session', async (req, res) => {
    res.json(await sessionView(db, req, devOutbox));
  });

  /**
   * The first step of a new account. The answer is the same whether or not the address has an account
   * (no account enumeration), and takes the same work: a request row is written either way. A new
   * address is e-mailed a link to finish, where the password is chosen (so that nobody can set the
   * password of an account in someone else's name); a known one is told it has an account.
   */
  router.post('/auth/sign-up', async (req, res) => {
    const input = signUpInputSchema.parse(req.body);
    res.status(202).json(await accounts.startSignUp({ db, config, mailer }, req, input));
  });

  /** What a sign-up link is for (the address, name and organisation), to show before the password is chosen. */
  router.get('/auth/sign-ups/:token', async (req, res) => {
    res.json(await accounts.pendingSignUp(db, req.params['token']));
  });

  /** Finishes a new account with its password: the account, its organisation, and a session. */
  router.post('/auth/sign-ups/:token', async (req, res) => {
    const { password } = finishSignUpSchema.parse(req.body);
    const created = await accounts.finishSignUp(db, req.params['token'], password);
    await startSession(req, created.user, created.organizationId);
    await audit(db, req, {
      type: 'account_created',
      organizationId: created.organizationId,
      userId: created.user.id,
      actorEmail: created.user.email,
    });
    req.log.info({ userId: created.user.id }, 'account created');
    res.status(201).json(await sessionView(db, req, devOutbox));
  });

  router.post('/auth/sign-in', async (req, res) => {
    req.body = signInInputSchema.parse(req.body);
    const user = await authenticateLocal(auth, req, res);
    const email = (req.body as { email: string }).email;
    if (!user) {
      await accounts.auditFailedSignIn(db, req, email);
      throw INVALID_CREDENTIALS;
    }
    await logIn(req, user);
    await audit(db, req, { type: 'sign_in', userId: user.id, actorEmail: user.email });
    await sessionView(db, req, devOutbox); // picks the current organisation
    await saveSession(req);
    res.json(await sessionView(db, req, devOutbox));
  });

  router.post('/auth/sign-out', async (req, res) => {
    await new Promise<void>((resolve, reject) => {
      req.logout((err) => (err ? reject(err as Error) : resolve()));
    });
    await new Promise<void>((resolve) => {
      req.session.destroy(() => resolve());
    });
    res.clearCookie(SESSION_COOKIE, { path: '/' });
    res.status(204).end();
  });

  /** Ends every session of the signed-in user, on every device, this one included. */
  router.post('/auth/sign-out-everywhere', requireUser, async (req, res) => {
    const user = currentUser(req);
    await accounts.signOutEverywhere(db, req, user);
    await new Promise<void>((resolve) => {
      req.session.destroy(() => resolve());
    });
    res.clearCookie(SESSION_COOKIE, { path: '/' });
    res.status(204).end();
  });

  router.post('/auth/password-resets', async (req, res) => {
    const { email } = passwordResetRequestSchema.parse(req.body);
    await accounts.requestPasswordReset({ db, config, mailer }, req, email);
    res
      .status(202)
      .json({ message: 'If an account exists for that address, we have e-mailed a link to reset its password' });
  });

  router.post('/auth/password-resets/:token', async (req, res) => {
    const { password } = passwordResetConfirmSchema.parse(req.body);
    await accounts.resetPassword(db, req, req.params['token'], password);
    res.status(204).end();
  });

  router.patch('/me', requireUser, async (req, res) => {
    const patch = updateMeSchema.parse(req.body);
    const user = currentUser(req);
    await accounts.updateMe(db, user.id, patch);
    Object.assign(user, patch);
    res.json(await sessionView(db, req, devOutbox));
  });

  router.put('/session/organization', requireUser, async (req, res) => {
    const { organizationId } = switchOrganizationSchema.parse(req.body);
    const role = await roleOf(db, organizationId, currentUser(req).id);
    if (!role) throw new HttpError(404, 'not_found', 'That organisation was not found');
    req.session.organizationId = organizationId;
    res.json(await sessionView(db, req, devOutbox));
  });

  return router;
}

export const SESSION_COOKIE = 'tailroom.sid';
