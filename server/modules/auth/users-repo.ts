import type { Knex } from 'knex';
import type { UnitSystem } from '@shared/units/units';
import type { Role } from '@shared/auth/roles';
import { prepared } from '../../db';
import { HttpError } from '../../http/http-error';
import { membershipsView } from '../orgs/orgs-repo';

export const TABLES = ['users'] as const;

export interface UserRecord {
  id: string;
  email: string;
  name: string;
  unitSystem: UnitSystem;
}

interface UserRow {
  id: string;
  email: string;
  name: string;
  password_hash: string;
  unit_system: UnitSystem;
}

const toUser = (r: UserRow): UserRecord => ({ id: r.id, email: r.email, name: r.name, unitSystem: r.unit_system });

/**
 * Read-only fragment for other areas (docs/architecture.md#read-only-views-of-another-areas-tables):
 * every account as a subquery with the columns `id`, `name` and `email`, to be joined under an alias of
 * the caller's choosing, e.g. `leftJoin(peopleView(db).as('uu'), 'uu.id', 'p.updated_by')` for the name of
 * who last changed a row. PostgreSQL folds it into the caller's statement, which stays one query.
 */
export const peopleView = (db: Knex) => db('users').select('id', 'name', 'email');

/**
 * The user and, in the same query, the user's role in `organizationId` (null when the user is not a
 * member, or no organisation is chosen): what every signed-in request needs, in one round trip.
 */
export async function findWithRole(
  db: Knex,
  id: string,
  organizationId: string | undefined,
): Promise<{ user: UserRecord; role: Role | null } | undefined> {
  const row = await prepared(
    db('users as u')
      .leftJoin(membershipsView(db).as('m'), (j) => {
        j.on('m.user_id', 'u.id').andOnVal('m.organization_id', organizationId ?? null);
      })
      .where('u.id', id)
      .first<(UserRow & { role: Role | null }) | undefined>('u.id', 'u.email', 'u.name', 'u.unit_system', 'm.role'),
  );
  return row && { user: toUser(row), role: organizationId ? row.role : null };
}

export async function findByEmailWithHash(
  db: Knex,
  email: string,
): Promise<{ user: UserRecord; passwordHash: string } | undefined> {
  const row = await db<UserRow>('users').where({ email }).first();
  return row && { user: toUser(row), passwordHash: row.password_hash };
}

/** 409 `email_taken`: said only to someone who has shown the address is theirs (a sign-up or invitation link). */
export const emailTaken = () =>
  new HttpError(409, 'email_taken', 'An account with this e-mail address already exists; sign in instead', [
    { path: 'email', message: 'An account with this e-mail address already exists' },
  ]);

/** Whether a database error is a unique-constraint violation (two requests made the same account at once). */
export const isUniqueViolation = (err: unknown) => (err as { code?: string }).code === '23505';

export async function emailExists(db: Knex, email: string): Promise<boolean> {
  return Boolean(await db('users').where({ email }).first('id'));
}

export async function insert(
  db: Knex,
  input: { email: string; name: string; passwordHash: string },
): Promise<UserRecord> {
  const [row] = await db<UserRow>('users')
    .insert({ email: input.email, name: input.name, password_hash: input.passwordHash })
    .returning('*');
  if (!row) throw new Error('insert returned no row');
  return toUser(row);
}

export async function update(
  db: Knex,
  id: string,
  patch: { name?: string; unitSystem?: UnitSystem; passwordHash?: string },
): Promise<void> {
  const row: Partial<UserRow> & { updated_at: Knex.Raw } = { updated_at: db.fn.now() };
  if (patch.name !== undefined) row.name = patch.name;
  if (patch.unitSystem !== undefined) row.unit_system = patch.unitSystem;
  if (patch.passwordHash !== undefined) row.password_hash = patch.passwordHash;
  await db('users').where({ id }).update(row);
}

/** The name and e-mail address of each of these users that still has an account, by id. */
export async function contactsByIds(
  db: Knex,
  ids: readonly string[],
): Promise<Map<string, { name: string; email: string }>> {
  const wanted = [...new Set(ids)];
  const rows = wanted.length
    ? await db('users')
        .whereIn('id', wanted)
        .select<{ id: string; name: string; email: string }[]>('id', 'name', 'email')
    : [];
  return new Map(rows.map((r) => [r.id, { name: r.name, email: r.email }]));
}

/** The id of the account with this address, compared without case (for the audit of a failed sign-in). */
export async function idByEmailAnyCase(db: Knex, email: string): Promise<string | null> {
  const row = await db('users').whereRaw('lower(email) = lower(?)', [email]).first<{ id: string } | undefined>('id');
  return row?.id ?? null;
}
