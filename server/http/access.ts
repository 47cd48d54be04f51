import type { RequestHandler } from 'express';
import type { Session, User } from 'lucia';

import { can, type Permission, type Role } from '../../src/shared/permissions';
import { forbidden, HttpError, unauthorized } from './errors';

/** Who is asking: set by the session middleware on every /api request that carries a valid session. */
export type AuthContext = {
  user: User;
  session: Session;
  /** The membership in the session's active organization, or null when the user has none. */
  membership: { organizationId: number; organizationName: string; role: Role } | null;
};

declare global {
  namespace Express {
    interface Request {
      auth?: AuthContext;
    }
  }
}

/** Who may call a route. Every API route declares one; the authorization test fails for a route that does not. */
export type AccessRule = { kind: 'public' } | { kind: 'signed-in' } | { kind: 'member'; permission: Permission } | { kind: 'development' };

export type AccessMiddleware = RequestHandler & { accessRule: AccessRule };

function withRule(rule: AccessRule, handler: RequestHandler): AccessMiddleware {
  return Object.assign(handler, { accessRule: rule });
}

/** The signed-in user's active membership, or an error saying why there is none. */
export function requireMembership(req: Parameters<RequestHandler>[0]): NonNullable<AuthContext['membership']> & { userId: string } {
  if (!req.auth) throw unauthorized();
  if (!req.auth.membership) throw new HttpError(403, 'no_organization', 'Choose an organization first (Account → Organizations).');
  return { ...req.auth.membership, userId: req.auth.user.id };
}

/**
 * Route guards. Put exactly one first in every API route:
 *   router.get('/', access.member('library:read'), handler)
 * `member` answers 401 when signed out, 403 when the role lacks the permission; the handler then scopes
 * every query to `requireMembership(req).organizationId`, answering 404 for another organization's rows.
 */
export const access = {
  public: (): AccessMiddleware => withRule({ kind: 'public' }, (_req, _res, next) => next()),
  signedIn: (): AccessMiddleware =>
    withRule({ kind: 'signed-in' }, (req, _res, next) => next(req.auth ? undefined : unauthorized())),
  member: (permission: Permission): AccessMiddleware =>
    withRule({ kind: 'member', permission }, (req, _res, next) => {
      if (!req.auth) return next(unauthorized());
      const membership = req.auth.membership;
      if (!membership) return next(new HttpError(403, 'no_organization', 'Choose an organization first (Account → Organizations).'));
      next(can(membership.role, permission) ? undefined : forbidden());
    }),
  /** Only where the development mail inbox runs (never in production). */
  development: (enabled: boolean): AccessMiddleware =>
    withRule({ kind: 'development' }, (_req, _res, next) => next(enabled ? undefined : new HttpError(404, 'not_found', 'Not available.'))),
};
