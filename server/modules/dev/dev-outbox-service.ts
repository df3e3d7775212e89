/** Development only: the messages the local SMTP sink has kept, all of them or those of one organisation. */
import type { Knex } from 'knex';
import { outboxMessageListSchema, type OutboxMessage } from '@shared/orgs/org-schemas';
import { HttpError } from '../../http/http-error';
import { organizationAddresses } from '../orgs/orgs-service';

/** Every message the sink holds (503 when it is not running). */
export async function allMessages(outboxUrl: string): Promise<OutboxMessage[]> {
  let body: unknown;
  try {
    const answer = await fetch(`${outboxUrl}/messages`);
    body = await answer.json();
  } catch {
    throw new HttpError(503, 'outbox_unavailable', 'The local e-mail sink is not running');
  }
  return outboxMessageListSchema.parse(body);
}

/** The messages to the organisation's members, its invitations and its report recipients (none once the user has left it). */
export async function organizationMessages(
  db: Knex,
  messages: readonly OutboxMessage[],
  organizationId: string,
  userId: string,
): Promise<OutboxMessage[]> {
  const addresses = await organizationAddresses(db, organizationId, userId);
  return messages.filter((m) => m.to.some((to) => addresses.has(to.trim().toLowerCase())));
}
