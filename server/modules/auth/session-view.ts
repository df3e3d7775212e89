import type { Request } from 'express';
import type { Knex } from 'knex';
import type { Session } from '@shared/auth/auth-schemas';
import type { UserRecord } from './users-repo';
import { membershipsOf } from '../orgs/orgs-repo';

declare module 'express-session' {
  interface SessionData {
    /** The organisation the user is working in. */
    organizationId?: string;
  }
}

/**
 * What GET /api/v1/session answers. Also repairs the session's current
 * organisation when the user no longer belongs to it (removed by an owner).
 */
export async function sessionView(db: Knex, req: Request, devOutbox: boolean): Promise<Session> {
  const user = req.user as UserRecord | undefined;
  if (!user) return { user: null, organizations: [], currentOrganizationId: null, devOutbox };
  const organizations = await membershipsOf(db, user.id);
  let current = req.session.organizationId;
  if (!current || !organizations.some((o) => o.id === current)) {
    current = organizations[0]?.id;
    req.session.organizationId = current;
  }
  return {
    user: { id: user.id, email: user.email, name: user.name, unitSystem: user.unitSystem },
    organizations,
    currentOrganizationId: current ?? null,
    devOutbox,
  };
}
