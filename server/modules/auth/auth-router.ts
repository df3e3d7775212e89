import { Router, type Request, type Response } from 'express';
import type { Knex } from 'knex';
import passport from 'passport';
import { Strategy as LocalStrategy } from 'passport-local';
import {
  linkTokenSchema,
  passwordResetConfirmSchema,
  passwordResetRequestSchema,
  finishSignUpSchema,
  signInInputSchema,
  signUpInputSchema,
  type PendingSignUp,
  type SignUpStarted,
  switchOrganizationSchema,
  updateMeSchema,
} from '@shared/auth/auth-schemas';
import type { Config } from '../../config';
import { currentUser, requireUser } from '../../http/authorize';
import { audit } from '../audit/audit';
import { HttpError } from '../../http/http-error';
import type { Mailer } from '../../mail/mailer';
import { accountExistsMail, finishSignUpMail, passwordResetMail } from '../../mail/messages';
import { createOrganization, roleOf } from '../orgs/orgs-repo';
import { hashLinkToken, newLinkToken } from './link-tokens';
import { burnVerification, hashPassword, verifyPassword } from './passwords';
import { logIn, saveSession, sessionView, startSession } from './session-view';
import * as users from './users-repo';
import type { UserRecord } from './users-repo';

const INVALID_CREDENTIALS = new HttpError(401, 'invalid_credentials', 'That e-mail and password do not match an account');

/**
 * This app's own passport (not the module's shared one, so that two apps in one process never share
 * a database): passport-local with e-mail and password, where unknown e-mail and wrong password answer alike.
 */
export function createPassport(db: Knex): passport.Authenticator {
  const auth = new passport.Passport();
  auth.use(
    new LocalStrategy({ usernameField: 'email', passwordField: 'password', session: true }, (email, password, done) => {
      void (async () => {
        const found = await users.findByEmailWithHash(db, email);
        if (!found) {
          await burnVerification(password);
          return done(null, false);
        }
        const ok = await verifyPassword(found.passwordHash, password);
        return done(null, ok ? found.user : false);
      })().catch(done);
    }),
  );
  auth.serializeUser((user, done) => {
    done(null, (user as UserRecord).id);
  });
  // The user and the role in the session's organisation, in one query; `authorize()` uses the role.
  auth.deserializeUser((req: Request, id: string, done: (err: unknown, user?: UserRecord | false) => void) => {
    const organizationId = req.session.organizationId;
    users.findWithRole(db, id, organizationId).then((found) => {
      if (found && organizationId) req.sessionRole = { organizationId, role: found.role };
      done(null, found?.user ?? false);
    }, done);
  });
  return auth;
}

function authenticateLocal(auth: passport.Authenticator, req: Request, res: Response): Promise<UserRecord | false> {
  return new Promise((resolve, reject) => {
    const handler = auth.authenticate('local', (err: unknown, user: UserRecord | false) => {
      if (err) reject(err instanceof Error ? err : new Error('authentication failed'));
      else resolve(user);
    }) as (req: Request, res: Response, next: (err?: unknown) => void) => void;
    handler(req, res, (err) => reject(err instanceof Error ? err : new Error(String(err))));
  });
}

/** How long an e-mailed sign-up link works. */
export const SIGN_UP_LINK_HOURS = 24;

interface SignUpRow {
  id: string;
  email: string;
  name: string;
  organization_name: string | null;
  expires_at: Date;
}

/** The unused, unexpired sign-up request of a link, or 400 `invalid_sign_up_link`. */
async function usableSignUp(db: Knex, token: unknown, options: { lock?: boolean } = {}): Promise<SignUpRow> {
  const invalid = new HttpError(400, 'invalid_sign_up_link', 'This link is not valid any more: it has been used or has expired. Start again to get a new one.');
  const parsed = linkTokenSchema.safeParse(token);
  if (!parsed.success) throw invalid;
  const query = db('sign_up_requests')
    .where({ token_hash: hashLinkToken(parsed.data) })
    .whereNull('used_at')
    .where('expires_at', '>', db.fn.now());
  const row = await (options.lock ? query.forUpdate() : query).first<SignUpRow | undefined>('id', 'email', 'name', 'organization_name', 'expires_at');
  if (!row) throw invalid;
  return row;
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
    const { token, hash } = newLinkToken();
    const expiresAt = new Date(Date.now() + SIGN_UP_LINK_HOURS * 3_600_000);
    const exists = await db.transaction(async (trx) => {
      await trx('sign_up_requests').where('expires_at', '<', trx.raw("now() - interval '1 day'")).delete();
      await trx('sign_up_requests').insert({
        email: input.email,
        name: input.name,
        organization_name: input.organizationName ?? null,
        token_hash: hash,
        expires_at: expiresAt,
      });
      return users.emailExists(trx, input.email);
    });
    const mail = exists
      ? accountExistsMail(input.email, `${config.publicUrl}/sign-in`, `${config.publicUrl}/forgot-password`)
      : finishSignUpMail(
          input.email,
          `${config.publicUrl}/finish-sign-up/${token}${input.returnUrl ? `?returnUrl=${encodeURIComponent(input.returnUrl)}` : ''}`,
          SIGN_UP_LINK_HOURS,
        );
    // Not awaited: the answer must not wait on the mail relay, nor differ in time between the two cases.
    mailer.send(mail).catch((err: unknown) => {
      req.log.error({ err }, 'sign-up e-mail failed');
    });
    const started: SignUpStarted = {
      email: input.email,
      message: `We have e-mailed ${input.email}. Follow the link in it to finish; it works for ${SIGN_UP_LINK_HOURS} hours.`,
    };
    res.status(202).json(started);
  });

  /** What a sign-up link is for (the address, name and organisation), to show before the password is chosen. */
  router.get('/auth/sign-ups/:token', async (req, res) => {
    const row = await usableSignUp(db, req.params['token']);
    const pending: PendingSignUp = {
      email: row.email,
      name: row.name,
      organizationName: row.organization_name,
      expiresAt: row.expires_at.toISOString(),
    };
    res.json(pending);
  });

  /** Finishes a new account with its password: the account, its organisation, and a session. */
  router.post('/auth/sign-ups/:token', async (req, res) => {
    const { password } = finishSignUpSchema.parse(req.body);
    await usableSignUp(db, req.params['token']);
    const passwordHash = await hashPassword(password);
    const created = await db
      .transaction(async (trx) => {
        const row = await usableSignUp(trx, req.params['token'], { lock: true });
        if (await users.emailExists(trx, row.email)) throw users.emailTaken();
        const user = await users.insert(trx, { email: row.email, name: row.name, passwordHash });
        // Every open request for the address ends with the account.
        await trx('sign_up_requests').where({ email: row.email }).whereNull('used_at').update({ used_at: trx.fn.now() });
        const organizationId = await createOrganization(trx, row.organization_name ?? `${row.name}'s firm`, user.id);
        return { user, organizationId };
      })
      .catch((err: unknown) => {
        throw users.isUniqueViolation(err) ? users.emailTaken() : err;
      });
    await startSession(req, created.user, created.organizationId);
    await audit(db, req, { type: 'account_created', organizationId: created.organizationId, userId: created.user.id, actorEmail: created.user.email });
    req.log.info({ userId: created.user.id }, 'account created');
    res.status(201).json(await sessionView(db, req, devOutbox));
  });

  router.post('/auth/sign-in', async (req, res) => {
    req.body = signInInputSchema.parse(req.body);
    const user = await authenticateLocal(auth, req, res);
    const email = (req.body as { email: string }).email;
    if (!user) {
      const known = await db('users').whereRaw('lower(email) = lower(?)', [email]).first<{ id: string } | undefined>('id');
      await audit(db, req, { type: 'sign_in_failed', userId: known?.id ?? null, actorEmail: email });
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
    const ended = await db('session').whereRaw(`(sess -> 'passport' ->> 'user') = ?`, [user.id]).delete();
    await audit(db, req, { type: 'sign_out_everywhere', userId: user.id, actorEmail: user.email, detail: { sessions: ended } });
    await new Promise<void>((resolve) => {
      req.session.destroy(() => resolve());
    });
    res.clearCookie(SESSION_COOKIE, { path: '/' });
    res.status(204).end();
  });

  router.post('/auth/password-resets', async (req, res) => {
    const { email } = passwordResetRequestSchema.parse(req.body);
    const found = await users.findByEmailWithHash(db, email);
    if (found) {
      const { token, hash } = newLinkToken();
      const expiresAt = new Date(Date.now() + config.resetLinkMinutes * 60_000);
      await db('password_resets').insert({ user_id: found.user.id, token_hash: hash, expires_at: expiresAt });
      const link = `${config.publicUrl}/reset-password/${token}`;
      // Not awaited: the answer must take as long for an unknown address as for a known one.
      mailer.send(passwordResetMail(found.user.email, link, config.resetLinkMinutes)).catch((err: unknown) => {
        req.log.error({ err, userId: found.user.id }, 'password-reset e-mail failed');
      });
    }
    res.status(202).json({ message: 'If an account exists for that address, we have e-mailed a link to reset its password' });
  });

  router.post('/auth/password-resets/:token', async (req, res) => {
    const tokenCheck = linkTokenSchema.safeParse(req.params['token']);
    const { password } = passwordResetConfirmSchema.parse(req.body);
    const invalid = new HttpError(400, 'invalid_reset_link', 'This reset link is not valid any more; ask for a new one');
    if (!tokenCheck.success) throw invalid;
    const passwordHash = await hashPassword(password);
    const userId = await db.transaction(async (trx) => {
      const row = await trx('password_resets')
        .where({ token_hash: hashLinkToken(tokenCheck.data) })
        .whereNull('used_at')
        .where('expires_at', '>', trx.fn.now())
        .forUpdate()
        .first<{ id: string; user_id: string } | undefined>('id', 'user_id');
      if (!row) throw invalid;
      await users.update(trx, row.user_id, { passwordHash });
      await trx('password_resets').where({ user_id: row.user_id }).whereNull('used_at').update({ used_at: trx.fn.now() });
      // Every session of that account ends: whoever knew the old password is signed out.
      await trx.raw(`DELETE FROM "session" WHERE (sess -> 'passport' ->> 'user') = ?`, [row.user_id]);
      return row.user_id;
    });
    await audit(db, req, { type: 'password_reset', userId });
    res.status(204).end();
  });

  router.patch('/me', requireUser, async (req, res) => {
    const patch = updateMeSchema.parse(req.body);
    const user = currentUser(req);
    await users.update(db, user.id, patch);
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
