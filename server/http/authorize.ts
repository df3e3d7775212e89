import type { Request, RequestHandler } from 'express';
import type { Knex } from 'knex';
import { can, type Action, type Role } from '@shared/auth/roles';
import { HttpError } from './http-error';
import type { UserRecord } from '../modules/auth/users-repo';

export interface OrgContext {
  user: UserRecord;
  organizationId: string;
  role: Role;
}

declare module 'express-serve-static-core' {
  interface Request {
    orgContext?: OrgContext;
    /** The user's role in the session's organisation, read with the user when the session was loaded. */
    sessionRole?: { organizationId: string; role: Role | null };
  }
}

/** The signed-in user, or 401. */
export function currentUser(req: Request): UserRecord {
  const user = req.user as UserRecord | undefined;
  if (!user) throw new HttpError(401, 'unauthenticated', 'Sign in to continue');
  return user;
}

/** The organisation context set by `authorize()`. */
export function orgContext(req: Request): OrgContext {
  if (!req.orgContext) throw new Error('authorize() must run before orgContext()');
  return req.orgContext;
}

/** Marks on a route's handlers which check guards it, for the test that walks the route table. */
export const GUARD = Symbol('tailroom.guard');
export type Guard = { kind: 'user' } | { kind: 'action'; action: Action };
type Guarded = RequestHandler & { [GUARD]?: Guard };

export const requireUser: RequestHandler = Object.assign<RequestHandler, { [GUARD]: Guard }>(
  (req, _res, next) => {
    currentUser(req);
    next();
  },
  { [GUARD]: { kind: 'user' } },
);

/**
 * The one authorisation layer: a signed-in user, a current organisation the user
 * still belongs to (membership is read on every request, with the user, so a
 * removal takes effect at once), and a role allowed to do `action`. 401 / 403 otherwise.
 */
export function authorize(db: Knex, action: Action): RequestHandler {
  const handler: Guarded = async (req, _res, next) => {
    const user = currentUser(req);
    const organizationId = req.session.organizationId;
    let role: Role | null = null;
    if (organizationId) {
      const known = req.sessionRole;
      role =
        known?.organizationId === organizationId
          ? known.role
          : ((
              await db('memberships')
                .where({ organization_id: organizationId, user_id: user.id })
                .first<{ role: Role } | undefined>('role')
            )?.role ?? null);
    }
    if (!organizationId || !role) {
      throw new HttpError(403, 'no_organization', 'Choose an organisation first');
    }
    if (!can(role, action)) {
      throw new HttpError(403, 'forbidden', 'Your role in this organisation does not allow that');
    }
    req.orgContext = { user, organizationId, role };
    next();
  };
  handler[GUARD] = { kind: 'action', action };
  return handler;
}
