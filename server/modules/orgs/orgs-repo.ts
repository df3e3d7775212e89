import type { Knex } from 'knex';
import type { MembershipSummary } from '@shared/auth/auth-schemas';
import type { Role } from '@shared/auth/roles';
import type { Member } from '@shared/orgs/org-schemas';

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
    .join('users as u', 'u.id', 'm.user_id')
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
