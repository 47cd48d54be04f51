import { and, eq } from 'drizzle-orm';
import { Router } from 'express';

import { idParams, updateMemberInput } from '../../src/shared/schemas/accounts';
import type { Db } from '../db/client';
import { countOwners, listMembers } from '../db/queries/accounts';
import { memberships } from '../db/schema';
import { access, requireMembership } from '../http/access';
import { HttpError, notFound } from '../http/errors';

async function findMember(db: Db, organizationId: number, id: number) {
  const [row] = await db.select().from(memberships).where(and(eq(memberships.id, id), eq(memberships.organizationId, organizationId)));
  if (!row) throw notFound('member', id);
  return row;
}

/** Members of the active organization: everyone sees the list; owners change roles and remove people. */
export function membersRouter({ db }: { db: Db }): Router {
  const router = Router();

  router.get('/', access.member('members:read'), async (req, res) => {
    res.json(await listMembers(db, requireMembership(req).organizationId));
  });

  router.patch('/:id', access.member('members:manage'), async (req, res) => {
    const { organizationId } = requireMembership(req);
    const { id } = idParams.parse(req.params);
    const { role } = updateMemberInput.parse(req.body);
    const member = await findMember(db, organizationId, id);
    if (member.role === 'owner' && role !== 'owner' && (await countOwners(db, organizationId)) <= 1) {
      throw new HttpError(409, 'last_owner', 'An organization needs at least one owner. Make someone else owner first.');
    }
    await db.update(memberships).set({ role }).where(eq(memberships.id, member.id));
    res.json((await listMembers(db, organizationId)).find((row) => row.id === member.id));
  });

  router.delete('/:id', access.member('members:manage'), async (req, res) => {
    const { organizationId } = requireMembership(req);
    const { id } = idParams.parse(req.params);
    const member = await findMember(db, organizationId, id);
    if (member.role === 'owner' && (await countOwners(db, organizationId)) <= 1) {
      throw new HttpError(409, 'last_owner', 'An organization needs at least one owner. Make someone else owner first.');
    }
    await db.delete(memberships).where(eq(memberships.id, member.id));
    res.status(204).end();
  });

  return router;
}
