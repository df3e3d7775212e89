/** The tables of account links and sessions: sign-up requests, password resets and the session store's `session`. */
import type { Knex } from 'knex';

export const TABLES = ['sign_up_requests', 'password_resets', 'session'] as const;

export interface SignUpRow {
  id: string;
  email: string;
  name: string;
  organization_name: string | null;
  expires_at: Date;
}

/** Forgets sign-up requests that expired more than a day ago. */
export async function pruneSignUps(db: Knex): Promise<void> {
  await db('sign_up_requests').where('expires_at', '<', db.raw("now() - interval '1 day'")).delete();
}

export async function insertSignUp(
  db: Knex,
  values: { email: string; name: string; organizationName: string | null; tokenHash: string; expiresAt: Date },
): Promise<void> {
  await db('sign_up_requests').insert({
    email: values.email,
    name: values.name,
    organization_name: values.organizationName,
    token_hash: values.tokenHash,
    expires_at: values.expiresAt,
  });
}

/** The unused, unexpired sign-up request with this token hash. */
export function findUsableSignUp(
  db: Knex,
  tokenHash: string,
  options: { lock?: boolean } = {},
): Promise<SignUpRow | undefined> {
  const query = db('sign_up_requests')
    .where({ token_hash: tokenHash })
    .whereNull('used_at')
    .where('expires_at', '>', db.fn.now());
  return (options.lock ? query.forUpdate() : query).first<SignUpRow | undefined>(
    'id',
    'email',
    'name',
    'organization_name',
    'expires_at',
  );
}

/** Every open request for the address ends (with the account it made). */
export async function closeSignUpsFor(db: Knex, email: string): Promise<void> {
  await db('sign_up_requests').where({ email }).whereNull('used_at').update({ used_at: db.fn.now() });
}

export async function insertPasswordReset(
  db: Knex,
  values: { userId: string; tokenHash: string; expiresAt: Date },
): Promise<void> {
  await db('password_resets').insert({
    user_id: values.userId,
    token_hash: values.tokenHash,
    expires_at: values.expiresAt,
  });
}

/** The unused, unexpired password reset with this token hash, locked for the caller's transaction. */
export function lockUsableReset(
  trx: Knex.Transaction,
  tokenHash: string,
): Promise<{ id: string; user_id: string } | undefined> {
  return trx('password_resets')
    .where({ token_hash: tokenHash })
    .whereNull('used_at')
    .where('expires_at', '>', trx.fn.now())
    .forUpdate()
    .first<{ id: string; user_id: string } | undefined>('id', 'user_id');
}

export async function closeResetsFor(db: Knex, userId: string): Promise<void> {
  await db('password_resets').where({ user_id: userId }).whereNull('used_at').update({ used_at: db.fn.now() });
}

/** Ends every stored session of the user; how many there were. */
export function deleteSessionsOf(db: Knex, userId: string): Promise<number> {
  return db('session').whereRaw(`(sess -> 'passport' ->> 'user') = ?`, [userId]).delete();
}
