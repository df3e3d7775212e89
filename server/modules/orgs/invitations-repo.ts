import type { Knex } from 'knex';
import type { Role } from '@shared/auth/roles';
import type { Invitation } from '@shared/orgs/org-schemas';
import { peopleView } from '../auth/users-repo';

export const TABLES = ['invitations'] as const;

interface InvitationRow {
  id: string;
  organization_id: string;
  email: string;
  role: Role;
  invited_by: string | null;
  expires_at: Date;
  accepted_at: Date | null;
  revoked_at: Date | null;
  created_at: Date;
}

export interface InvitationRecord {
  id: string;
  organizationId: string;
  email: string;
  role: Role;
  status: Invitation['status'];
  expiresAt: Date;
}

function statusOf(r: InvitationRow, now = new Date()): Invitation['status'] {
  if (r.accepted_at) return 'accepted';
  if (r.revoked_at) return 'revoked';
  if (r.expires_at <= now) return 'expired';
  return 'pending';
}

const toRecord = (r: InvitationRow): InvitationRecord => ({
  id: r.id,
  organizationId: r.organization_id,
  email: r.email,
  role: r.role,
  status: statusOf(r),
  expiresAt: r.expires_at,
});

export async function findByTokenHash(
  db: Knex,
  tokenHash: string,
  options: { lock?: boolean } = {},
): Promise<InvitationRecord | undefined> {
  const query = db('invitations').where('token_hash', tokenHash);
  const row = await (options.lock ? query.forUpdate() : query).first<InvitationRow | undefined>();
  return row && toRecord(row);
}

export async function listForOrganization(db: Knex, organizationId: string): Promise<Invitation[]> {
  const rows = await db('invitations as i')
    .leftJoin(peopleView(db).as('u'), 'u.id', 'i.invited_by')
    .where('i.organization_id', organizationId)
    .orderBy('i.created_at', 'desc')
    .select<(InvitationRow & { invited_by_name: string | null })[]>('i.*', 'u.name as invited_by_name');
  return rows.map((r) => ({
    id: r.id,
    email: r.email,
    role: r.role,
    invitedByName: r.invited_by_name ?? 'A former member',
    createdAt: r.created_at.toISOString(),
    expiresAt: r.expires_at.toISOString(),
    status: statusOf(r),
  }));
}

/** Revokes the pending invitations of this address; how many there were. */
export function revokePendingFor(db: Knex, organizationId: string, email: string): Promise<number> {
  return db('invitations')
    .where({ organization_id: organizationId, email })
    .whereNull('accepted_at')
    .whereNull('revoked_at')
    .update({ revoked_at: db.fn.now() });
}

export async function insertInvitation(
  db: Knex,
  values: { organizationId: string; email: string; role: Role; tokenHash: string; invitedBy: string; expiresAt: Date },
): Promise<{ id: string; created_at: Date }> {
  const [row] = await db('invitations')
    .insert({
      organization_id: values.organizationId,
      email: values.email,
      role: values.role,
      token_hash: values.tokenHash,
      invited_by: values.invitedBy,
      expires_at: values.expiresAt,
    })
    .returning<{ id: string; created_at: Date }[]>(['id', 'created_at']);
  if (!row) throw new Error('insert returned no row');
  return row;
}

/** Revokes an invitation of the organisation (one already revoked keeps its time); false when there is none. */
export async function revokeInvitation(db: Knex, organizationId: string, id: string): Promise<boolean> {
  const n = await db('invitations')
    .where({ id, organization_id: organizationId })
    .update({ revoked_at: db.raw('COALESCE(revoked_at, now())') });
  return n > 0;
}

export async function markAccepted(db: Knex, id: string): Promise<void> {
  await db('invitations').where({ id }).update({ accepted_at: db.fn.now() });
}

/** The organisation's name and the inviter's name (null when that person has no account any more). */
export function invitationDetails(
  db: Knex,
  id: string,
): Promise<{ organization_name: string; invited_by_name: string | null } | undefined> {
  return db('invitations as i')
    .join('organizations as o', 'o.id', 'i.organization_id')
    .leftJoin(peopleView(db).as('u'), 'u.id', 'i.invited_by')
    .where('i.id', id)
    .first<{ organization_name: string; invited_by_name: string | null } | undefined>(
      'o.name as organization_name',
      'u.name as invited_by_name',
    );
}

/** Open invitations that still take a place on the plan. */
export async function pendingCount(db: Knex, organizationId: string): Promise<number> {
  const [row] = await db('invitations')
    .where({ organization_id: organizationId })
    .whereNull('accepted_at')
    .whereNull('revoked_at')
    .where('expires_at', '>', db.fn.now())
    .count<{ n: number }[]>('id as n');
  return row?.n ?? 0;
}

/** The addresses the organisation has ever invited, in lower case. */
export async function invitedAddresses(db: Knex, organizationId: string): Promise<string[]> {
  const rows = await db('invitations')
    .where({ organization_id: organizationId })
    .select<{ address: string }[]>(db.raw('lower(email) as address'));
  return rows.map((r) => r.address);
}
