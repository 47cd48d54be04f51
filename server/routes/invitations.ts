import { and, desc, eq, gt, isNull } from 'drizzle-orm';
import { Router } from 'express';
import { z } from 'zod';

import type { InvitationPreview, PendingInvitation } from '../../src/shared/schemas/accounts';
import { acceptInvitationInput, createInvitationInput, idParams } from '../../src/shared/schemas/accounts';
import type { AccountsDeps } from '../auth/deps';
import { publicBaseUrl } from '../auth/session-middleware';
import { hashToken, newToken } from '../auth/tokens';
import type { Db } from '../db/client';
import { addMembership, findOpenInvitation, findUserByEmail, getMembership } from '../db/queries/accounts';
import { invitations, sessions, users } from '../db/schema';
import { access, requireMembership } from '../http/access';
import { HttpError, notFound } from '../http/errors';
import { invitationMail } from '../mail/messages';
import { sessionInfo } from './auth';

const INVITATION_DAYS = 7;

async function listPending(db: Db, organizationId: number): Promise<PendingInvitation[]> {
  const rows = await db
    .select({ id: invitations.id, email: invitations.email, role: invitations.role, expiresAt: invitations.expiresAt, invitedBy: users.name })
    .from(invitations)
    .leftJoin(users, eq(users.id, invitations.invitedByUserId))
    .where(and(eq(invitations.organizationId, organizationId), isNull(invitations.acceptedAt), gt(invitations.expiresAt, new Date())))
    .orderBy(desc(invitations.id));
  return rows.map((row) => ({ ...row, expiresAt: row.expiresAt.toISOString() }));
}

/** Invitations by e-mail: owners send and withdraw them; the invited person previews and accepts. */
export function invitationsRouter(deps: AccountsDeps): Router {
  const { db } = deps;
  const router = Router();

  router.get('/', access.member('members:manage'), async (req, res) => {
    res.json(await listPending(db, requireMembership(req).organizationId));
  });

  router.post('/', access.member('members:manage'), async (req, res) => {
    const member = requireMembership(req);
    const input = createInvitationInput.parse(req.body);
    const existing = await findUserByEmail(db, input.email);
    if (existing && (await getMembership(db, existing.id, member.organizationId))) {
      throw new HttpError(409, 'already_member', `${input.email} is already a member of ${member.organizationName}.`, { email: ['Already a member.'] });
    }
    const { token, tokenHash } = newToken();
    const [created] = await db
      .insert(invitations)
      .values({ organizationId: member.organizationId, email: input.email, role: input.role, tokenHash, invitedByUserId: member.userId, expiresAt: new Date(Date.now() + INVITATION_DAYS * 86_400_000) })
      .$returningId();
    const link = `${publicBaseUrl(req, deps.publicUrl)}/invitation?token=${token}`;
    await deps.mailer.send(invitationMail({ to: input.email, organizationName: member.organizationName, role: input.role, inviterName: req.auth!.user.name, link }));
    const pending = (await listPending(db, member.organizationId)).find((row) => row.id === created.id);
    res.status(201).json(pending);
  });

  router.delete('/:id', access.member('members:manage'), async (req, res) => {
    const { id } = idParams.parse(req.params);
    const result = await db.delete(invitations).where(and(eq(invitations.id, id), eq(invitations.organizationId, requireMembership(req).organizationId), isNull(invitations.acceptedAt)));
    if (result[0].affectedRows === 0) throw notFound('open invitation', id);
    res.status(204).end();
  });

  router.get('/preview', access.public(), async (req, res) => {
    const { token } = z.object({ token: z.string().min(20).max(100) }).parse(req.query);
    const found = await findOpenInvitation(db, hashToken(token));
    if (!found) throw new HttpError(404, 'invalid_token', 'This invitation has expired, was withdrawn or was already used. Ask for a new one.');
    const body: InvitationPreview = {
      organizationName: found.organizationName,
      role: found.invitation.role,
      email: found.invitation.email,
      accountExists: !!(await findUserByEmail(db, found.invitation.email)),
    };
    res.json(body);
  });

  router.post('/accept', access.signedIn(), async (req, res) => {
    const { token } = acceptInvitationInput.parse(req.body);
    const found = await findOpenInvitation(db, hashToken(token));
    if (!found) throw new HttpError(404, 'invalid_token', 'This invitation has expired, was withdrawn or was already used. Ask for a new one.');
    const user = req.auth!.user;
    if (found.invitation.email !== user.email) {
      throw new HttpError(403, 'wrong_account', `This invitation was sent to ${found.invitation.email}; you are signed in as ${user.email}.`);
    }
    await db.transaction(async (tx) => {
      await addMembership(tx as unknown as Db, user.id, found.invitation.organizationId, found.invitation.role);
      await tx.update(invitations).set({ acceptedAt: new Date() }).where(eq(invitations.id, found.invitation.id));
      await tx.update(sessions).set({ activeOrganizationId: found.invitation.organizationId }).where(eq(sessions.id, req.auth!.session.id));
    });
    res.json(await sessionInfo(db, user.id, found.invitation.organizationId));
  });

  return router;
}
