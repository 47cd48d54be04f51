import { eq } from 'drizzle-orm';
import { Router, type Request, type Response } from 'express';
import { generateIdFromEntropySize } from 'lucia';

import {
  activeOrganizationInput,
  passwordResetConfirmInput,
  passwordResetRequestInput,
  signInInput,
  signUpInput,
  type SessionInfo,
} from '../../src/shared/schemas/accounts';
import { burnPasswordCheck, hashPassword, verifyPassword } from '../auth/passwords';
import type { AccountsDeps } from '../auth/deps';
import { publicBaseUrl } from '../auth/session-middleware';
import { hashToken, newToken } from '../auth/tokens';
import type { Db } from '../db/client';
import { addMembership, findOpenInvitation, findUserByEmail, getMembership, listMemberships } from '../db/queries/accounts';
import { copyReferenceLibrary } from '../db/queries/ingredients';
import { invitations, organizations, passwordResets, sessions, users } from '../db/schema';
import { access } from '../http/access';
import { HttpError, notFound } from '../http/errors';
import { passwordResetMail } from '../mail/messages';

const RESET_LINK_HOURS = 1;

export async function sessionInfo(db: Db, userId: string, activeOrganizationId: number | null): Promise<SessionInfo> {
  const [user] = await db.select({ id: users.id, email: users.email, name: users.name }).from(users).where(eq(users.id, userId));
  return { user, memberships: await listMemberships(db, userId), activeOrganizationId };
}

/** Starts a session in `organizationId` (or the user's first organization) and sets the cookie. */
export async function startSession(deps: AccountsDeps, res: Response, userId: string, organizationId?: number | null): Promise<SessionInfo> {
  const active = organizationId ?? (await listMemberships(deps.db, userId))[0]?.organizationId ?? null;
  const session = await deps.lucia.createSession(userId, { activeOrganizationId: active });
  res.append('Set-Cookie', deps.lucia.createSessionCookie(session.id).serialize());
  return sessionInfo(deps.db, userId, active);
}

const clientKey = (req: Request) => req.ip ?? 'unknown';

/** Sign-up, sign-in, sign-out, who am I, switching organization, password reset. */
export function authRouter(deps: AccountsDeps): Router {
  const { db, lucia } = deps;
  const router = Router();

  router.post('/sign-up', access.public(), async (req, res) => {
    const input = signUpInput.parse(req.body);
    if (await findUserByEmail(db, input.email)) {
      throw new HttpError(409, 'email_taken', 'An account with this e-mail already exists. Sign in, or reset the password if it is forgotten.', { email: ['Already registered.'] });
    }
    const invitation = input.invitationToken ? await findOpenInvitation(db, hashToken(input.invitationToken)) : undefined;
    if (input.invitationToken && !invitation) throw new HttpError(400, 'invalid_token', 'This invitation has expired or was already used. Ask for a new one.');
    if (invitation && invitation.invitation.email !== input.email) {
      throw new HttpError(400, 'invalid_input', `This invitation was sent to ${invitation.invitation.email}. Sign up with that address.`, { email: ['Use the invited address.'] });
    }
    const userId = generateIdFromEntropySize(10);
    const passwordHash = await hashPassword(input.password);
    const organizationId = await db.transaction(async (tx) => {
      await tx.insert(users).values({ id: userId, email: input.email, name: input.name, passwordHash });
      if (invitation) {
        await addMembership(tx as unknown as Db, userId, invitation.invitation.organizationId, invitation.invitation.role);
        await tx.update(invitations).set({ acceptedAt: new Date() }).where(eq(invitations.id, invitation.invitation.id));
        return invitation.invitation.organizationId;
      }
      const [org] = await tx.insert(organizations).values({ name: input.organizationName!, kind: input.organizationKind ?? 'feed_mill' }).$returningId();
      await addMembership(tx as unknown as Db, userId, org.id, 'owner');
      return org.id;
    });
    // A new organization starts its own library as a copy of the reference tables (its own transaction;
    // should it fail, the library screen still offers the copy).
    if (!invitation) {
      await copyReferenceLibrary(db, organizationId).catch((error: unknown) => console.error('Reference library copy failed for a new organization', error));
    }
    res.status(201).json(await startSession(deps, res, userId, organizationId));
  });

  router.post('/sign-in', access.public(), async (req, res) => {
    const input = signInInput.parse(req.body);
    const key = `${clientKey(req)}|${input.email}`;
    const wait = Math.max(deps.signInLimiter.retryAfterSeconds(key), deps.clientLimiter.retryAfterSeconds(clientKey(req)));
    if (wait > 0) {
      res.setHeader('Retry-After', String(wait));
      throw new HttpError(429, 'too_many_attempts', `Too many sign-in attempts. Try again in ${Math.ceil(wait / 60)} minute(s).`);
    }
    const user = await findUserByEmail(db, input.email);
    const ok = user ? await verifyPassword(user.passwordHash, input.password) : (await burnPasswordCheck(input.password), false);
    if (!user || !ok) {
      deps.signInLimiter.recordFailure(key);
      deps.clientLimiter.recordFailure(clientKey(req));
      // The same words whether the e-mail is unknown or the password wrong: no account fishing.
      throw new HttpError(401, 'invalid_credentials', 'That e-mail and password do not match an account.');
    }
    deps.signInLimiter.clear(key);
    res.json(await startSession(deps, res, user.id));
  });

  router.post('/sign-out', access.signedIn(), async (req, res) => {
    await lucia.invalidateSession(req.auth!.session.id);
    res.append('Set-Cookie', lucia.createBlankSessionCookie().serialize());
    res.status(204).end();
  });

  router.get('/me', access.signedIn(), async (req, res) => {
    res.json(await sessionInfo(db, req.auth!.user.id, req.auth!.membership?.organizationId ?? null));
  });

  router.put('/active-organization', access.signedIn(), async (req, res) => {
    const { organizationId } = activeOrganizationInput.parse(req.body);
    if (!(await getMembership(db, req.auth!.user.id, organizationId))) throw notFound('organization of yours', organizationId);
    await db.update(sessions).set({ activeOrganizationId: organizationId }).where(eq(sessions.id, req.auth!.session.id));
    res.json(await sessionInfo(db, req.auth!.user.id, organizationId));
  });

  router.post('/password-reset', access.public(), async (req, res) => {
    const { email } = passwordResetRequestInput.parse(req.body);
    const key = `reset|${clientKey(req)}`;
    if (deps.resetLimiter.retryAfterSeconds(key) > 0) throw new HttpError(429, 'too_many_attempts', 'Too many reset requests from here. Try again later.');
    deps.resetLimiter.recordFailure(key);
    const user = await findUserByEmail(db, email);
    if (user) {
      const { token, tokenHash } = newToken();
      await db.insert(passwordResets).values({ tokenHash, userId: user.id, expiresAt: new Date(Date.now() + RESET_LINK_HOURS * 3600_000) });
      const link = `${publicBaseUrl(req, deps.publicUrl)}/reset-password?token=${token}`;
      await deps.mailer.send(passwordResetMail({ to: user.email, link }));
    }
    res.status(202).json({ message: 'If an account uses this e-mail, a link to choose a new password is on its way.' });
  });

  router.post('/password-reset/confirm', access.public(), async (req, res) => {
    const input = passwordResetConfirmInput.parse(req.body);
    const [reset] = await db.select().from(passwordResets).where(eq(passwordResets.tokenHash, hashToken(input.token)));
    if (!reset || reset.usedAt || reset.expiresAt.getTime() < Date.now()) {
      throw new HttpError(400, 'invalid_token', 'This link has expired or was already used. Ask for a new one.');
    }
    const passwordHash = await hashPassword(input.password);
    await db.transaction(async (tx) => {
      await tx.update(users).set({ passwordHash }).where(eq(users.id, reset.userId));
      await tx.update(passwordResets).set({ usedAt: new Date() }).where(eq(passwordResets.tokenHash, reset.tokenHash));
    });
    // Whoever knew the old password is signed out everywhere.
    await lucia.invalidateUserSessions(reset.userId);
    res.json({ message: 'Your password is changed. Sign in with the new one.' });
  });

  return router;
}
