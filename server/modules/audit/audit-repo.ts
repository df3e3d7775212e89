/** The audit log's table, `audit_events`. */
import type { Knex } from 'knex';

export const TABLES = ['audit_events'] as const;

export interface AuditRow {
  public_id: string;
  type: string;
  detail: unknown;
  ip: string | null;
  created_at: Date;
  actor_email: string | null;
  user_id: string | null;
}

export async function insertEvent(
  db: Knex,
  values: {
    organizationId: string | null;
    userId: string | null;
    actorEmail: string | null;
    type: string;
    detail: unknown;
    ip: string | null;
  },
): Promise<void> {
  await db('audit_events').insert({
    organization_id: values.organizationId,
    user_id: values.userId,
    actor_email: values.actorEmail,
    type: values.type,
    detail: JSON.stringify(values.detail),
    ip: values.ip,
  });
}

/** The latest 200 events of the organisation, and the account events (`personalTypes`) of these users. */
export function recentEvents(
  db: Knex,
  organizationId: string,
  userIds: readonly string[],
  personalTypes: readonly string[],
): Promise<AuditRow[]> {
  return db('audit_events as a')
    .where('a.organization_id', organizationId)
    .orWhere((q) => q.whereNull('a.organization_id').whereIn('a.type', personalTypes).whereIn('a.user_id', userIds))
    .orderBy('a.created_at', 'desc')
    .limit(200)
    .select<AuditRow[]>('a.public_id', 'a.type', 'a.detail', 'a.ip', 'a.created_at', 'a.actor_email', 'a.user_id');
}
