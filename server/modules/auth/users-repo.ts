import type { Knex } from 'knex';
import type { UnitSystem } from '@shared/auth/auth-schemas';

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

export async function findById(db: Knex, id: string): Promise<UserRecord | undefined> {
  const row = await db<UserRow>('users').where({ id }).first();
  return row && toUser(row);
}

export async function findByEmailWithHash(
  db: Knex,
  email: string,
): Promise<{ user: UserRecord; passwordHash: string } | undefined> {
  const row = await db<UserRow>('users').where({ email }).first();
  return row && { user: toUser(row), passwordHash: row.password_hash };
}

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
