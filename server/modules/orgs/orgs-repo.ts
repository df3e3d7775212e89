import type { Knex } from 'knex';
import type { MembershipSummary } from '@shared/auth/auth-schemas';
import type { Role } from '@shared/auth/roles';
import type { Member } from '@shared/orgs/org-schemas';
import { peopleView } from '../auth/users-repo';

export const TABLES = ['organizations', 'memberships'] as const;

/**
 * Read-only fragment for other areas (docs/architecture.md#read-only-views-of-another-areas-tables):
 * every membership as a subquery with the columns `organization_id`, `user_id` and `role`, to be joined
 * under an alias of the caller's choosing (the session's user is read with their role this way, in one
 * query). PostgreSQL folds it into the caller's statement.
 */
export const membershipsView = (db: Knex) => db('memberships').select('organization_id', 'user_id', 'role');

export async function createOrganization(db: Knex, name: string, ownerId: string): Promise<string> {
  const [org] = await db('organizations').insert({ name }).returning<{ id: string }[]>('id');
  if (!org) throw new Error('insert returned no row');
  await db('memberships').insert({ organization_id: org.id, user_id: ownerId, role: 'owner' });
  return org.id;
}

export async function membershipsOf(db: Knex, userId: string): Promise<MembershipSummary[]> {
  const rows = await db('memberships as m')
    .join('organizations as o', 'o.id', 'm.organization_id')
    .where('m.user_id', userId)
    .orderBy([{ column: 'o.name' }, { column: 'o.id' }])
    .select<{ id: string; name: string; role: Role }[]>('o.id', 'o.name', 'm.role');
  return rows.map((r) => ({ id: r.id, name: r.name, role: r.role }));
}

export async function roleOf(db: Knex, organizationId: string, userId: string): Promise<Role | undefined> {
  const row = await db('memberships')
    .where({ organization_id: organizationId, user_id: userId })
    .first<{ role: Role } | undefined>('role');
  return row?.role;
}

export async function addMember(db: Knex, organizationId: string, userId: string, role: Role): Promise<void> {
  await db('memberships')
    .insert({ organization_id: organizationId, user_id: userId, role })
    .onConflict(['organization_id', 'user_id'])
    .ignore();
}

interface MemberRow {
  user_id: string;
  email: string;
  name: string;
  role: Role;
  created_at: Date;
}

const toMember = (r: MemberRow): Member => ({
  userId: r.user_id,
  email: r.email,
  name: r.name,
  role: r.role,
  joinedAt: r.created_at.toISOString(),
});

function memberQuery(db: Knex, organizationId: string) {
  return db('memberships as m')
    .join(peopleView(db).as('u'), 'u.id', 'm.user_id')
    .where('m.organization_id', organizationId)
    .select<MemberRow[]>('m.user_id', 'u.email', 'u.name', 'm.role', 'm.created_at');
}

export async function listMembers(db: Knex, organizationId: string): Promise<Member[]> {
  const rows = await memberQuery(db, organizationId).orderBy([{ column: 'u.name' }, { column: 'u.email' }]);
  return rows.map(toMember);
}

export async function findMember(db: Knex, organizationId: string, userId: string): Promise<Member | undefined> {
  const rows = await memberQuery(db, organizationId).andWhere('m.user_id', userId);
  return rows[0] && toMember(rows[0]);
}

/** Locks the organisation's owner rows, so two concurrent demotions cannot both pass the last-owner check. */
export async function lockedOwnerCount(trx: Knex.Transaction, organizationId: string): Promise<number> {
  const rows = await trx('memberships')
    .where({ organization_id: organizationId, role: 'owner' })
    .forUpdate()
    .select('user_id');
  return rows.length;
}

/** The organisation's name (an organisation is never deleted while it has a session or a report). */
export async function organizationName(db: Knex, organizationId: string): Promise<string> {
  const row = await db('organizations').where({ id: organizationId }).first<{ name: string } | undefined>('name');
  if (!row) throw new Error('organisation not found');
  return row.name;
}

export async function setRole(db: Knex, organizationId: string, userId: string, role: Role): Promise<void> {
  await db('memberships')
    .where({ organization_id: organizationId, user_id: userId })
    .update({ role, updated_at: db.fn.now() });
}

export async function removeMember(db: Knex, organizationId: string, userId: string): Promise<void> {
  await db('memberships').where({ organization_id: organizationId, user_id: userId }).delete();
}

/** Whether a member of the organisation has this e-mail address. */
export async function isMemberByEmail(db: Knex, organizationId: string, email: string): Promise<boolean> {
  const row: unknown = await db('memberships as m')
    .join(peopleView(db).as('u'), 'u.id', 'm.user_id')
    .where({ 'm.organization_id': organizationId, 'u.email': email })
    .first('m.user_id');
  return Boolean(row);
}

export async function memberCount(db: Knex, organizationId: string): Promise<number> {
  const [row] = await db('memberships')
    .where({ organization_id: organizationId })
    .count<{ n: number }[]>('user_id as n');
  return row?.n ?? 0;
}

/** Locks the organisation's row for the caller's transaction (plan limits are checked under it). */
export async function lockOrganization(trx: Knex.Transaction, organizationId: string): Promise<void> {
  await trx('organizations').where({ id: organizationId }).forUpdate().first('id');
}

/** The organisations that still exist among these ids. */
export async function existingOrganizations(db: Knex, ids: readonly string[]): Promise<Set<string>> {
  if (ids.length === 0) return new Set();
  const rows = await db('organizations').whereIn('id', ids).select<{ id: string }[]>('id');
  return new Set(rows.map((r) => r.id));
}

/** The user ids of the organisation's members. */
export async function memberUserIds(db: Knex, organizationId: string): Promise<string[]> {
  const rows = await db('memberships')
    .where({ organization_id: organizationId })
    .select<{ user_id: string }[]>('user_id');
  return rows.map((r) => r.user_id);
}

/** The e-mail addresses of the organisation's members, in lower case. */
export async function memberAddresses(db: Knex, organizationId: string): Promise<string[]> {
  const rows = await db('memberships as m')
    .join(peopleView(db).as('u'), 'u.id', 'm.user_id')
    .where('m.organization_id', organizationId)
    .select<{ address: string }[]>(db.raw('lower(u.email) as address'));
  return rows.map((r) => r.address);
}
