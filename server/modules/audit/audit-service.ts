/**
 * The audit log: security-relevant events, written beside the action they record (never failing it),
 * and read by owners: their organisation's events and the sign-ins of its members.
 */
import type { Request } from 'express';
import type { Knex } from 'knex';
import { contactsByIds } from '../auth/users-repo';
import { memberUserIds } from '../orgs/orgs-repo';
import * as repo from './audit-repo';

export const auditTypes = [
  'account_created',
  'member_joined',
  'password_reset',
  'sign_in',
  'sign_in_failed',
  'sign_out_everywhere',
  'role_changed',
  'member_removed',
  'invitation_created',
  'invitation_revoked',
  'plan_changed',
  'report_link_created',
  'report_link_revoked',
  'report_sent',
] as const;
export type AuditType = (typeof auditTypes)[number];

export interface AuditEntry {
  type: AuditType;
  organizationId?: string | null;
  userId?: string | null;
  actorEmail?: string | null;
  detail?: Record<string, unknown>;
}

export async function audit(db: Knex, req: Request | null, entry: AuditEntry): Promise<void> {
  try {
    await repo.insertEvent(db, {
      organizationId: entry.organizationId ?? null,
      userId: entry.userId ?? null,
      actorEmail: entry.actorEmail ?? null,
      type: entry.type,
      detail: entry.detail ?? {},
      ip: req?.ip ?? null,
    });
  } catch (err) {
    req?.log.error({ err, type: entry.type }, 'audit event not written');
  }
}

/** Account events without an organisation that an owner sees for the organisation's members. */
const PERSONAL_TYPES = ['sign_in', 'sign_in_failed', 'sign_out_everywhere', 'password_reset'];

/** The organisation's latest events, each with who did it. */
export async function recentEvents(db: Knex, organizationId: string) {
  const rows = await repo.recentEvents(db, organizationId, await memberUserIds(db, organizationId), PERSONAL_TYPES);
  const people = await contactsByIds(
    db,
    rows.flatMap((r) => (r.user_id ? [r.user_id] : [])),
  );
  return rows.map((r) => ({
    id: r.public_id,
    type: r.type,
    detail: r.detail,
    ip: r.ip,
    at: r.created_at.toISOString(),
    // Events without a person (the payment provider's confirmations) name where they came from.
    who:
      (r.user_id ? people.get(r.user_id)?.name : undefined) ??
      r.actor_email ??
      (r.type === 'plan_changed' ? 'The payment provider' : 'The system'),
  }));
}
