import { double, index, int, json, mysqlEnum, mysqlTable, timestamp, uniqueIndex, varchar } from 'drizzle-orm/mysql-core';

import type { FormulaInputs, VersionSnapshot } from '../../../src/shared/schemas/formulas';
import { users } from './accounts';
import { organizations } from './organizations';
import { species, specifications } from './requirements';

/**
 * A formula being worked on: its name and current inputs (batch, ingredients with price and inclusion
 * overrides, bounds). The inputs change as the planner works; what was solved and kept lives in
 * formula_versions, which never change.
 */
export const formulas = mysqlTable(
  'formulas',
  {
    id: int().autoincrement().primaryKey(),
    organizationId: int().notNull().references(() => organizations.id, { onDelete: 'cascade' }),
    name: varchar({ length: 160 }).notNull(),
    speciesId: int().references(() => species.id, { onDelete: 'set null' }),
    specificationId: int().references(() => specifications.id, { onDelete: 'set null' }),
    inputs: json().$type<FormulaInputs>().notNull(),
    /** Rises with each saved change, so two people editing one formula never overwrite each other silently. */
    revision: int().notNull().default(1),
    createdByUserId: varchar({ length: 40 }).references(() => users.id, { onDelete: 'set null' }),
    createdAt: timestamp().notNull().defaultNow(),
    updatedAt: timestamp().notNull().defaultNow().onUpdateNow(),
    /**
     * Set when the formula was taken out of the mill's daily view (archived): it is then read-only and
     * its approved version leaves the operators' list, while batch sheets, the batch log and shared
     * links keep working. Null while the formula is in use.
     */
    archivedAt: timestamp({ fsp: 3 }),
    archivedBy: varchar({ length: 40 }).references(() => users.id, { onDelete: 'set null' }),
  },
  (t) => [index('formulas_org_name').on(t.organizationId, t.name), index('formulas_org_archived').on(t.organizationId, t.archivedAt)],
);

export const VERSION_STATUSES = ['optimal', 'infeasible', 'unbounded', 'failed'] as const;

/**
 * A kept solve. Immutable: only the approval columns are ever written after the insert. The snapshot
 * holds the inputs, the library values and prices as used, the problem given to the engine and its
 * result, so a later library edit never changes a version.
 */
export const formulaVersions = mysqlTable(
  'formula_versions',
  {
    id: int().autoincrement().primaryKey(),
    formulaId: int().notNull().references(() => formulas.id, { onDelete: 'cascade' }),
    organizationId: int().notNull().references(() => organizations.id, { onDelete: 'cascade' }),
    /** 1, 2, 3… within the formula. */
    number: int().notNull(),
    status: mysqlEnum(VERSION_STATUSES).notNull(),
    /** Cost per tonne as fed; null when no mix was found. */
    costPerTonne: double(),
    note: varchar({ length: 500 }),
    snapshot: json().$type<VersionSnapshot>().notNull(),
    createdByUserId: varchar({ length: 40 }).references(() => users.id, { onDelete: 'set null' }),
    createdByName: varchar({ length: 160 }).notNull(),
    createdAt: timestamp().notNull().defaultNow(),
    approvedByUserId: varchar({ length: 40 }).references(() => users.id, { onDelete: 'set null' }),
    approvedByName: varchar({ length: 160 }),
    approvedAt: timestamp({ fsp: 3 }),
  },
  (t) => [uniqueIndex('formula_versions_number').on(t.formulaId, t.number), index('formula_versions_org_approved').on(t.organizationId, t.approvedAt)],
);

export type FormulaRow = typeof formulas.$inferSelect;
export type NewFormulaRow = typeof formulas.$inferInsert;
export type FormulaVersionRow = typeof formulaVersions.$inferSelect;
export type NewFormulaVersionRow = typeof formulaVersions.$inferInsert;
