import type { Request, RequestHandler } from 'express';
import { verifyRequestOrigin } from 'lucia';

import type { Db } from '../db/client';
import { getMembership } from '../db/queries/accounts';
import { HttpError } from '../http/errors';
import type { TroughlineLucia } from './lucia';

/**
 * Reads the session cookie, validates it with lucia, refreshes it when lucia extends the session, and
 * sets `req.auth` with the membership of the session's active organization.
 */
export function sessionMiddleware(lucia: TroughlineLucia, db: Db): RequestHandler {
  return async (req, res, next) => {
    const sessionId = lucia.readSessionCookie(req.headers.cookie ?? '');
    if (!sessionId) return next();
    const { session, user } = await lucia.validateSession(sessionId);
    if (session?.fresh) res.append('Set-Cookie', lucia.createSessionCookie(session.id).serialize());
    if (!session || !user) {
      res.append('Set-Cookie', lucia.createBlankSessionCookie().serialize());
      return next();
    }
    const active = session.activeOrganizationId ? await getMembership(db, user.id, session.activeOrganizationId) : undefined;
    req.auth = { user, session, membership: active ?? null };
    next();
  };
}

const SAFE_METHODS = new Set(['GET', 'HEAD', 'OPTIONS']);

/**
 * CSRF defence, with SameSite=Lax cookies as the first layer: a state-changing request must carry an
 * Origin (or, failing that, a Referer) of this very host. Browsers always send Origin on fetch POSTs;
 * a form posted from another site carries that site's origin and is refused.
 */
export const sameOriginOnly: RequestHandler = (req, _res, next) => {
  if (SAFE_METHODS.has(req.method)) return next();
  const host = req.get('host');
  const origin = req.get('origin') ?? refererOrigin(req);
  if (host && origin && verifyRequestOrigin(origin, [host])) return next();
  next(new HttpError(403, 'cross_site_request', 'This request did not come from Troughline’s own pages, so it was refused.'));
};

function refererOrigin(req: Request): string | undefined {
  const referer = req.get('referer');
  if (!referer) return undefined;
  try {
    return new URL(referer).origin;
  } catch {
    return undefined;
  }
}

/** The address links in e-mails point to: PUBLIC_URL when set, else the address the request came to. */
export function publicBaseUrl(req: Request, configured?: string): string {
  return configured ?? `${req.protocol}://${req.get('host')}`;
}
