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

/** Signs `user` in on this request; passport regenerates the session id here (no session fixation). */
export function logIn(req: Request, user: UserRecord): Promise<void> {
  return new Promise((resolve, reject) => {
    req.logIn(user, (err) => (err ? reject(err as Error) : resolve()));
  });
}

export function saveSession(req: Request): Promise<void> {
  return new Promise((resolve, reject) => {
    req.session.save((err) => (err ? reject(err as Error) : resolve()));
  });
}

/** A new account's first session: signed in, working in `organizationId`, saved. */
export async function startSession(req: Request, user: UserRecord, organizationId: string): Promise<void> {
  await logIn(req, user);
  req.session.organizationId = organizationId;
  await saveSession(req);
}
