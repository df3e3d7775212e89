import type { Knex } from 'knex';
import type { Role } from '@shared/auth/roles';
import type { Invitation } from '@shared/orgs/org-schemas';

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
    .leftJoin('users as u', 'u.id', 'i.invited_by')
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
