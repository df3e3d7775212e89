/**
 * Accounts: the two-step sign-up (an e-mailed link, then the password), password resets, and ending
 * every session of an account. Answers do not tell whether an address has an account.
 */
import type { Request } from 'express';
import passport from 'passport';
import { Strategy as LocalStrategy } from 'passport-local';
import type { Knex } from 'knex';
import { linkTokenSchema, type PendingSignUp, type SignUpStarted } from '@shared/auth/auth-schemas';
import type { Config } from '../../config';
import { HttpError } from '../../http/http-error';
import type { Mailer } from '../../mail/mailer';
import { accountExistsMail, finishSignUpMail, passwordResetMail } from '../../mail/messages';
import { audit } from '../audit/audit-service';
import { createOrganization } from '../orgs/orgs-repo';
import * as repo from './auth-repo';
import { hashLinkToken, newLinkToken } from './link-tokens';
import { burnVerification, hashPassword, verifyPassword } from './passwords';
import * as users from './users-repo';

/** How long an e-mailed sign-up link works. */
export const SIGN_UP_LINK_HOURS = 24;

/** The unused, unexpired sign-up request of a link, or 400 `invalid_sign_up_link`. */
async function usableSignUp(db: Knex, token: unknown, options: { lock?: boolean } = {}): Promise<repo.SignUpRow> {
  const invalid = new HttpError(
    400,
    'invalid_sign_up_link',
    'This link is not valid any more: it has been used or has expired. Start again to get a new one.',
  );
  const parsed = linkTokenSchema.safeParse(token);
  if (!parsed.success) throw invalid;
  const row = await repo.findUsableSignUp(db, hashLinkToken(parsed.data), options);
  if (!row) throw invalid;
  return row;
}

/**
 * The first step of a new account. The answer is the same whether or not the address has an account
 * (no account enumeration), and takes the same work: a request row is written either way. A new
 * address is e-mailed a link to finish, where the password is chosen (so that nobody can set the
 * password of an account in someone else's name); a known one is told it has an account.
 */
export async function startSignUp(
  deps: { db: Knex; config: Config; mailer: Mailer },
  req: Request,
  input: { email: string; name: string; organizationName?: string | undefined; returnUrl?: string | undefined },
): Promise<SignUpStarted> {
  const { db, config, mailer } = deps;
  const { token, hash } = newLinkToken();
  const expiresAt = new Date(Date.now() + SIGN_UP_LINK_HOURS * 3_600_000);
  const exists = await db.transaction(async (trx) => {
    await repo.pruneSignUps(trx);
    await repo.insertSignUp(trx, {
      email: input.email,
      name: input.name,
      organizationName: input.organizationName ?? null,
      tokenHash: hash,
      expiresAt,
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
  return {
    email: input.email,
    message: `We have e-mailed ${input.email}. Follow the link in it to finish; it works for ${SIGN_UP_LINK_HOURS} hours.`,
  };
}

/** What a sign-up link is for (the address, name and organisation), to show before the password is chosen. */
export async function pendingSignUp(db: Knex, token: unknown): Promise<PendingSignUp> {
  const row = await usableSignUp(db, token);
  return {
    email: row.email,
    name: row.name,
    organizationName: row.organization_name,
    expiresAt: row.expires_at.toISOString(),
  };
}

/** Finishes a new account with its password: the account and its organisation. */
export async function finishSignUp(
  db: Knex,
  token: unknown,
  password: string,
): Promise<{ user: users.UserRecord; organizationId: string }> {
  await usableSignUp(db, token);
  const passwordHash = await hashPassword(password);
  return db
    .transaction(async (trx) => {
      const row = await usableSignUp(trx, token, { lock: true });
      if (await users.emailExists(trx, row.email)) throw users.emailTaken();
      const user = await users.insert(trx, { email: row.email, name: row.name, passwordHash });
      // Every open request for the address ends with the account.
      await repo.closeSignUpsFor(trx, row.email);
      const organizationId = await createOrganization(trx, row.organization_name ?? `${row.name}'s firm`, user.id);
      return { user, organizationId };
    })
    .catch((err: unknown) => {
      throw users.isUniqueViolation(err) ? users.emailTaken() : err;
    });
}

/** Records a failed sign-in (with the account of the address, if there is one). */
export async function auditFailedSignIn(db: Knex, req: Request, email: string): Promise<void> {
  await audit(db, req, { type: 'sign_in_failed', userId: await users.idByEmailAnyCase(db, email), actorEmail: email });
}

/** Ends every session of the user, on every device (audited). */
export async function signOutEverywhere(db: Knex, req: Request, user: users.UserRecord): Promise<void> {
  const ended = await repo.deleteSessionsOf(db, user.id);
  await audit(db, req, {
    type: 'sign_out_everywhere',
    userId: user.id,
    actorEmail: user.email,
    detail: { sessions: ended },
  });
}

/** E-mails a reset link when the address has an account; does the same visible work either way. */
export async function requestPasswordReset(
  deps: { db: Knex; config: Config; mailer: Mailer },
  req: Request,
  email: string,
): Promise<void> {
  const { db, config, mailer } = deps;
  const found = await users.findByEmailWithHash(db, email);
  if (!found) return;
  const { token, hash } = newLinkToken();
  const expiresAt = new Date(Date.now() + config.resetLinkMinutes * 60_000);
  await repo.insertPasswordReset(db, { userId: found.user.id, tokenHash: hash, expiresAt });
  const link = `${config.publicUrl}/reset-password/${token}`;
  // Not awaited: the answer must take as long for an unknown address as for a known one.
  mailer.send(passwordResetMail(found.user.email, link, config.resetLinkMinutes)).catch((err: unknown) => {
    req.log.error({ err, userId: found.user.id }, 'password-reset e-mail failed');
  });
}

/** Sets a new password through a reset link, and ends every session of the account (400 for a link that cannot be used). */
export async function resetPassword(db: Knex, req: Request, token: unknown, password: string): Promise<void> {
  const tokenCheck = linkTokenSchema.safeParse(token);
  const invalid = new HttpError(400, 'invalid_reset_link', 'This reset link is not valid any more; ask for a new one');
  if (!tokenCheck.success) throw invalid;
  const passwordHash = await hashPassword(password);
  const userId = await db.transaction(async (trx) => {
    const row = await repo.lockUsableReset(trx, hashLinkToken(tokenCheck.data));
    if (!row) throw invalid;
    await users.update(trx, row.user_id, { passwordHash });
    await repo.closeResetsFor(trx, row.user_id);
    // Every session of that account ends: whoever knew the old password is signed out.
    await repo.deleteSessionsOf(trx, row.user_id);
    return row.user_id;
  });
  await audit(db, req, { type: 'password_reset', userId });
}

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
    done(null, (user as users.UserRecord).id);
  });
  // The user and the role in the session's organisation, in one query; `authorize()` uses the role.
  auth.deserializeUser((req: Request, id: string, done: (err: unknown, user?: users.UserRecord | false) => void) => {
    const organizationId = req.session.organizationId;
    users.findWithRole(db, id, organizationId).then((found) => {
      if (found && organizationId) req.sessionRole = { organizationId, role: found.role };
      done(null, found?.user ?? false);
    }, done);
  });
  return auth;
}

/** Changes the signed-in user's own name, unit system or password. */
export function updateMe(db: Knex, userId: string, patch: Parameters<typeof users.update>[2]): Promise<void> {
  return users.update(db, userId, patch);
}
