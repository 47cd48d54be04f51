import { datetime, index, int, mysqlEnum, mysqlTable, timestamp, uniqueIndex, varchar } from 'drizzle-orm/mysql-core';

import { ROLES } from '../../../src/shared/permissions';
import { organizations } from './organizations';

/** A person who signs in. Ids are random strings (lucia's convention), never sequential. */
export const users = mysqlTable('users', {
  id: varchar({ length: 40 }).primaryKey(),
  email: varchar({ length: 254 }).notNull().unique(),
  name: varchar({ length: 120 }).notNull(),
  passwordHash: varchar({ length: 255 }).notNull(),
  createdAt: timestamp().notNull().defaultNow(),
});

/** Sign-in sessions (lucia). The active organization travels with the session. */
export const sessions = mysqlTable('sessions', {
  id: varchar({ length: 255 }).primaryKey(),
  userId: varchar({ length: 40 }).notNull().references(() => users.id, { onDelete: 'cascade' }),
  expiresAt: datetime().notNull(),
  activeOrganizationId: int().references(() => organizations.id, { onDelete: 'set null' }),
});

/** A person's place in an organization, with one role there. */
export const memberships = mysqlTable(
  'memberships',
  {
    id: int().autoincrement().primaryKey(),
    userId: varchar({ length: 40 }).notNull().references(() => users.id, { onDelete: 'cascade' }),
    organizationId: int().notNull().references(() => organizations.id, { onDelete: 'cascade' }),
    role: mysqlEnum(ROLES).notNull(),
    createdAt: timestamp().notNull().defaultNow(),
  },
  (t) => [uniqueIndex('memberships_user_org').on(t.userId, t.organizationId), index('memberships_org').on(t.organizationId)],
);

/** An invitation by e-mail to join an organization with a role. Only a hash of the token is kept. */
export const invitations = mysqlTable(
  'invitations',
  {
    id: int().autoincrement().primaryKey(),
    organizationId: int().notNull().references(() => organizations.id, { onDelete: 'cascade' }),
    email: varchar({ length: 254 }).notNull(),
    role: mysqlEnum(ROLES).notNull(),
    tokenHash: varchar({ length: 64 }).notNull().unique(),
    invitedByUserId: varchar({ length: 40 }).references(() => users.id, { onDelete: 'set null' }),
    expiresAt: datetime().notNull(),
    acceptedAt: datetime(),
    createdAt: timestamp().notNull().defaultNow(),
  },
  (t) => [index('invitations_org').on(t.organizationId)],
);

/** Single-use, expiring password reset links. Only a hash of the token is kept. */
export const passwordResets = mysqlTable('password_resets', {
  tokenHash: varchar({ length: 64 }).primaryKey(),
  userId: varchar({ length: 40 }).notNull().references(() => users.id, { onDelete: 'cascade' }),
  expiresAt: datetime().notNull(),
  usedAt: datetime(),
  createdAt: timestamp().notNull().defaultNow(),
});

export type UserRow = typeof users.$inferSelect;
export type NewUserRow = typeof users.$inferInsert;
export type MembershipRow = typeof memberships.$inferSelect;
export type InvitationRow = typeof invitations.$inferSelect;
