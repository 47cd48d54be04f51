import type { Db } from '../../../server/db/client';
import type { Role } from '../../../src/shared/permissions';

/** Who calls: signed out, each role in organization A, or `outsider` (the owner of organization B). */
export type Caller = 'signed_out' | Role | 'outsider';

export const CALLERS: readonly Caller[] = ['signed_out', 'owner', 'nutritionist', 'mill_operator', 'advisor', 'farm_member', 'outsider'];

export type HttpMethod = 'GET' | 'POST' | 'PUT' | 'PATCH' | 'DELETE';

/** The world every rule set works in: two organizations, a user per role in A, an owner in B. */
export type AuthWorld = {
  db: Db;
  orgA: { id: number };
  orgB: { id: number };
  /** User ids by caller (signed_out has none). */
  userIds: Record<Exclude<Caller, 'signed_out'>, string>;
  emails: Record<Exclude<Caller, 'signed_out'>, string>;
};

/** One row of the table: a route, how to call it in organization A, and the status expected from each caller. */
export type RouteCase = {
  method: HttpMethod;
  /** The route's pattern as Express has it, e.g. /api/ingredients/:id — matched against the app's routes. */
  pattern: string;
  /** A concrete URL in organization A. */
  url: string;
  body?: unknown;
  /**
   * Called before each caller's request when a call changes state (a delete, an accept), so every
   * caller meets the same starting point. Returns the URL and body to use for that caller.
   */
  prepare?: (caller: Caller) => Promise<{ url?: string; body?: unknown }>;
  /** Call with a session of its own, for calls that end or move the caller's session (sign-out, accepting an invitation). */
  freshSession?: boolean;
  expect: Record<Caller, number>;
};

export type RuleSet = { area: string; cases: (world: AuthWorld) => Promise<RouteCase[]> };

/**
 * Expectations written out per role: `roles` get `ok`, the other roles 403, signed out 401, and the
 * outsider `outsider` (404 for a row of organization A, `ok` for a list that shows B's own rows).
 */
export function allowOnly(roles: readonly Role[], ok: number, { outsider }: { outsider: number }): Record<Caller, number> {
  const all: Role[] = ['owner', 'nutritionist', 'mill_operator', 'advisor', 'farm_member'];
  const expect = { signed_out: 401, outsider } as Record<Caller, number>;
  for (const role of all) expect[role] = roles.includes(role) ? ok : 403;
  return expect;
}
