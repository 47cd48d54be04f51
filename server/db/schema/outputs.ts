import { date, double, index, int, json, mysqlEnum, mysqlTable, timestamp, varchar } from 'drizzle-orm/mysql-core';

import { UNIT_SYSTEMS } from '../../../src/shared/measures';
import type { SharedPayload } from '../../../src/shared/schemas/shares';
import { users } from './accounts';
import { formulas, formulaVersions } from './formulas';
import { organizations } from './organizations';

/** How an organization reads amounts and money. No row: metric and EUR. */
export const organizationSettings = mysqlTable('organization_settings', {
  organizationId: int().primaryKey().references(() => organizations.id, { onDelete: 'cascade' }),
  unitSystem: mysqlEnum(UNIT_SYSTEMS).notNull().default('metric'),
  /** ISO 4217 code, e.g. EUR, KES. */
  currency: varchar({ length: 3 }).notNull().default('EUR'),
  updatedAt: timestamp().notNull().defaultNow().onUpdateNow(),
});

/**
 * A batch made at the mill from an approved version. Kept as written: the amounts are in kg whatever
 * the unit the operator typed in; the formula's name and version number are copied so the log reads
 * the same after the formula changes.
 */
export const batchLogs = mysqlTable(
  'batch_logs',
  {
    id: int().autoincrement().primaryKey(),
    organizationId: int().notNull().references(() => organizations.id, { onDelete: 'cascade' }),
    formulaId: int().references(() => formulas.id, { onDelete: 'set null' }),
    versionId: int().references(() => formulaVersions.id, { onDelete: 'set null' }),
    formulaName: varchar({ length: 160 }).notNull(),
    versionNumber: int().notNull(),
    madeOn: date({ mode: 'string' }).notNull(),
    batchKg: double().notNull(),
    operatorName: varchar({ length: 120 }).notNull(),
    deviation: varchar({ length: 1000 }),
    recordedByUserId: varchar({ length: 40 }).references(() => users.id, { onDelete: 'set null' }),
    createdAt: timestamp().notNull().defaultNow(),
  },
  (t) => [index('batch_logs_org_made').on(t.organizationId, t.madeOn)],
);

export const SHARE_KINDS = ['formula_version', 'ration_check'] as const;

/**
 * A result shared with a farm: a read-only copy of what was shared (it never changes when the formula
 * does), readable by the members of the receiving organization only.
 */
export const shares = mysqlTable(
  'shares',
  {
    id: int().autoincrement().primaryKey(),
    /** Random, so a link cannot be guessed from another. */
    token: varchar({ length: 32 }).notNull().unique(),
    fromOrganizationId: int().notNull().references(() => organizations.id, { onDelete: 'cascade' }),
    toOrganizationId: int().notNull().references(() => organizations.id, { onDelete: 'cascade' }),
    kind: mysqlEnum(SHARE_KINDS).notNull(),
    title: varchar({ length: 200 }).notNull(),
    note: varchar({ length: 1000 }),
    payload: json().$type<SharedPayload>().notNull(),
    sharedByUserId: varchar({ length: 40 }).references(() => users.id, { onDelete: 'set null' }),
    sharedByName: varchar({ length: 160 }).notNull(),
    recipients: json().$type<string[]>().notNull(),
    createdAt: timestamp().notNull().defaultNow(),
  },
  (t) => [index('shares_to_org').on(t.toOrganizationId, t.createdAt)],
);

export type OrganizationSettingsRow = typeof organizationSettings.$inferSelect;
export type BatchLogRow = typeof batchLogs.$inferSelect;
export type ShareRow = typeof shares.$inferSelect;
