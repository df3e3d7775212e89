/**
 * The audit log: security-relevant events, written beside the action they record (never failing it),
 * and read by owners (`GET /api/v1/audit`): their organisation's events and the sign-ins of its members.
 */
import { Router, type Request } from 'express';
import type { Knex } from 'knex';
import { authorize, orgContext } from '../../http/authorize';

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
    await db('audit_events').insert({
      organization_id: entry.organizationId ?? null,
      user_id: entry.userId ?? null,
      actor_email: entry.actorEmail ?? null,
      type: entry.type,
      detail: JSON.stringify(entry.detail ?? {}),
      ip: req?.ip ?? null,
    });
  } catch (err) {
    req?.log.error({ err, type: entry.type }, 'audit event not written');
  }
}

export function auditRouter(db: Knex): Router {
  const router = Router();
  router.get('/audit', authorize(db, 'member:manage'), async (req, res) => {
    const { organizationId } = orgContext(req);
    const rows = await db('audit_events as a')
      .leftJoin('users as u', 'u.id', 'a.user_id')
      .where('a.organization_id', organizationId)
      .orWhere((q) =>
        q
          .whereNull('a.organization_id')
          .whereIn('a.type', ['sign_in', 'sign_in_failed', 'sign_out_everywhere', 'password_reset'])
          .whereIn('a.user_id', db('memberships').where({ organization_id: organizationId }).select('user_id')),
      )
      .orderBy('a.created_at', 'desc')
      .limit(200)
      .select<{ public_id: string; type: string; detail: unknown; ip: string | null; created_at: Date; actor_email: string | null; user_name: string | null }[]>(
        'a.public_id',
        'a.type',
        'a.detail',
        'a.ip',
        'a.created_at',
        'a.actor_email',
        'u.name as user_name',
      );
    res.json(
      rows.map((r) => ({
        id: r.public_id,
        type: r.type,
        detail: r.detail,
        ip: r.ip,
        at: r.created_at.toISOString(),
        // Events without a person (the payment provider's confirmations) name where they came from.
        who: r.user_name ?? r.actor_email ?? (r.type === 'plan_changed' ? 'The payment provider' : 'The system'),
      })),
    );
  });
  return router;
}
