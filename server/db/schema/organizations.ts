import { int, mysqlEnum, mysqlTable, timestamp, varchar } from 'drizzle-orm/mysql-core';

/** What kind of place an organization is; it decides defaults, not permissions. */
export const ORGANIZATION_KINDS = ['feed_mill', 'farm', 'advisory'] as const;

/** A mill, a farm or an advisory office. Everything a user keeps belongs to exactly one. */
export const organizations = mysqlTable('organizations', {
  id: int().autoincrement().primaryKey(),
  name: varchar({ length: 160 }).notNull(),
  kind: mysqlEnum(ORGANIZATION_KINDS).notNull(),
  createdAt: timestamp().notNull().defaultNow(),
});

export type OrganizationRow = typeof organizations.$inferSelect;
export type NewOrganizationRow = typeof organizations.$inferInsert;
