import { Router, type Request, type Response } from 'express';
import type { Knex } from 'knex';
import passport from 'passport';
import { Strategy as LocalStrategy } from 'passport-local';
import {
  linkTokenSchema,
  passwordResetConfirmSchema,
  passwordResetRequestSchema,
  signInInputSchema,
  signUpInputSchema,
  switchOrganizationSchema,
  updateMeSchema,
} from '@shared/auth/auth-schemas';
import type { Config } from '../../config';
import { currentUser, requireUser } from '../../http/authorize';
import { audit } from '../audit/audit';
import { HttpError } from '../../http/http-error';
import type { Mailer } from '../../mail/mailer';
import { passwordResetMail } from '../../mail/messages';
import { addMember, createOrganization, roleOf } from '../orgs/orgs-repo';
import { findPendingInvitation } from '../orgs/invitations-repo';
import { hashLinkToken, newLinkToken } from './link-tokens';
import { burnVerification, hashPassword, verifyPassword } from './passwords';
import { sessionView } from './session-view';
import * as users from './users-repo';
import type { UserRecord } from './users-repo';

const INVALID_CREDENTIALS = new HttpError(401, 'invalid_credentials', 'That e-mail and password do not match an account');

/** passport-local: e-mail and password; unknown e-mail and wrong password answer alike. */
export function configurePassport(db: Knex): void {
  passport.use(
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
  passport.serializeUser((user, done) => {
    done(null, (user as UserRecord).id);
  });
  // The user and the role in the session's organisation, in one query; `authorize()` uses the role.
  passport.deserializeUser((req: Request, id: string, done: (err: unknown, user?: UserRecord | false) => void) => {
    const organizationId = req.session.organizationId;
    users.findWithRole(db, id, organizationId).then((found) => {
      if (found && organizationId) req.sessionRole = { organizationId, role: found.role };
      done(null, found?.user ?? false);
    }, done);
  });
}

function authenticateLocal(req: Request, res: Response): Promise<UserRecord | false> {
  return new Promise((resolve, reject) => {
    const handler = passport.authenticate('local', (err: unknown, user: UserRecord | false) => {
      if (err) reject(err instanceof Error ? err : new Error('authentication failed'));
      else resolve(user);
    }) as (req: Request, res: Response, next: (err?: unknown) => void) => void;
    handler(req, res, (err) => reject(err instanceof Error ? err : new Error(String(err))));
  });
}

/** Signs in; passport regenerates the session id here (session fixation). */
function logIn(req: Request, user: UserRecord): Promise<void> {
  return new Promise((resolve, reject) => {
    req.logIn(user, (err) => (err ? reject(err as Error) : resolve()));
  });
}

function saveSession(req: Request): Promise<void> {
  return new Promise((resolve, reject) => {
    req.session.save((err) => (err ? reject(err as Error) : resolve()));
  });
}

const isUniqueViolation = (err: unknown) => (err as { code?: string }).code === '23505';

export function authRouter(db: Knex, config: Config, mailer: Mailer): Router {
  const router = Router();
  const devOutbox = Boolean(config.devOutboxUrl);

  router.get('/session', async (req, res) => {
    res.json(await sessionView(db, req, devOutbox));
  });

  router.post('/auth/sign-up', async (req, res) => {
    const input = signUpInputSchema.parse(req.body);
    const passwordHash = await hashPassword(input.password);
    let created: { user: UserRecord; organizationId: string };
    try {
      created = await db.transaction(async (trx) => {
        if (await users.emailExists(trx, input.email)) {
          throw new HttpError(409, 'email_taken', 'An account with that e-mail already exists; sign in instead', [
            { path: 'email', message: 'An account with that e-mail already exists' },
          ]);
        }
        const invitation = input.invitationToken
          ? await findPendingInvitation(trx, hashLinkToken(input.invitationToken), { lock: true })
          : undefined;
        if (input.invitationToken && invitation?.email !== input.email) {
          throw new HttpError(422, 'invitation_mismatch', 'This invitation is not valid for that e-mail address', [
            { path: 'email', message: 'Use the e-mail address the invitation was sent to' },
          ]);
        }
        const user = await users.insert(trx, { email: input.email, name: input.name, passwordHash });
        if (invitation) {
          await addMember(trx, invitation.organizationId, user.id, invitation.role);
          await trx('invitations').where({ id: invitation.id }).update({ accepted_at: trx.fn.now() });
          return { user, organizationId: invitation.organizationId };
        }
        const orgName = input.organizationName ?? `${input.name}'s firm`;
        return { user, organizationId: await createOrganization(trx, orgName, user.id) };
      });
    } catch (err) {
      if (isUniqueViolation(err)) {
        throw new HttpError(409, 'email_taken', 'An account with that e-mail already exists; sign in instead', [
          { path: 'email', message: 'An account with that e-mail already exists' },
        ]);
      }
      throw err;
    }
    await logIn(req, created.user);
    req.session.organizationId = created.organizationId;
    await saveSession(req);
    req.log.info({ userId: created.user.id }, 'account created');
    res.status(201).json(await sessionView(db, req, devOutbox));
  });

  router.post('/auth/sign-in', async (req, res) => {
    req.body = signInInputSchema.parse(req.body);
    const user = await authenticateLocal(req, res);
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
    await db.transaction(async (trx) => {
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
    });
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
