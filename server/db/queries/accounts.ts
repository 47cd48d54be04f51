import { and, eq, gt, isNull } from 'drizzle-orm';

import type { SessionInfo } from '../../../src/shared/schemas/accounts';
import type { Role } from '../../../src/shared/permissions';
import type { Db } from '../client';
import { invitations, memberships, organizations, users } from '../schema';

export async function findUserByEmail(db: Db, email: string) {
  const [row] = await db.select().from(users).where(eq(users.email, email.toLowerCase()));
  return row;
}

/** Memberships of a user with their organizations' names, oldest first. */
export async function listMemberships(db: Db, userId: string): Promise<SessionInfo['memberships']> {
  const rows = await db
    .select({ organizationId: organizations.id, organizationName: organizations.name, organizationKind: organizations.kind, role: memberships.role })
    .from(memberships)
    .innerJoin(organizations, eq(organizations.id, memberships.organizationId))
    .where(eq(memberships.userId, userId))
    .orderBy(memberships.id);
  return rows;
}

export async function getMembership(db: Db, userId: string, organizationId: number) {
  const [row] = await db
    .select({ organizationId: organizations.id, organizationName: organizations.name, role: memberships.role })
    .from(memberships)
    .innerJoin(organizations, eq(organizations.id, memberships.organizationId))
    .where(and(eq(memberships.userId, userId), eq(memberships.organizationId, organizationId)));
  return row;
}

export async function listMembers(db: Db, organizationId: number) {
  const rows = await db
    .select({ id: memberships.id, userId: users.id, name: users.name, email: users.email, role: memberships.role, joinedAt: memberships.createdAt })
    .from(memberships)
    .innerJoin(users, eq(users.id, memberships.userId))
    .where(eq(memberships.organizationId, organizationId))
    .orderBy(users.name);
  return rows.map((row) => ({ ...row, joinedAt: row.joinedAt.toISOString() }));
}

export async function countOwners(db: Db, organizationId: number): Promise<number> {
  const rows = await db.select({ id: memberships.id }).from(memberships).where(and(eq(memberships.organizationId, organizationId), eq(memberships.role, 'owner')));
  return rows.length;
}

export async function findOpenInvitation(db: Db, tokenHash: string) {
  const [row] = await db
    .select({ invitation: invitations, organizationName: organizations.name })
    .from(invitations)
    .innerJoin(organizations, eq(organizations.id, invitations.organizationId))
    .where(and(eq(invitations.tokenHash, tokenHash), isNull(invitations.acceptedAt), gt(invitations.expiresAt, new Date())));
  return row;
}

export async function addMembership(db: Db, userId: string, organizationId: number, role: Role) {
  await db.insert(memberships).values({ userId, organizationId, role }).onDuplicateKeyUpdate({ set: { role } });
}
