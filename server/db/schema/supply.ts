import { boolean, double, index, int, json, mysqlEnum, mysqlTable, text, timestamp, varchar } from 'drizzle-orm/mysql-core';

import type { OriginAnimal } from '../../../src/shared/library-terms';
import { SUBSTRATE_KINDS } from '../../../src/shared/supply/substrates';
import { users } from './accounts';
import { ingredients } from './library';
import { organizations } from './organizations';

/**
 * A weekly insect supply plan: the by-product streams larvae are reared on, and how the larvae are processed.
 * Null factors mean "use the default" (src/shared/supply), so a later correction of a default reaches every
 * plan that did not set its own. `version` rises with every change.
 */
export const supplyPlans = mysqlTable(
  'supply_plans',
  {
    id: int().autoincrement().primaryKey(),
    organizationId: int().notNull().references(() => organizations.id, { onDelete: 'cascade' }),
    name: varchar({ length: 160 }).notNull(),
    notes: text(),
    /** Press the dried larvae into meal and oil. */
    defatted: boolean().notNull().default(false),
    /** Fat left in the pressed meal, % as fed. */
    residualFatPct: double(),
    /** Dry matter of the dried meal, %. */
    mealDryMatterPct: double(),
    /** Water in the rearing residue as taken off, %. */
    residueMoisturePct: double(),
    /** The organization's library entry for this meal: its lab analysis overrides the estimate, its other values complete it. */
    mealIngredientId: int().references(() => ingredients.id, { onDelete: 'set null' }),
    soybeanYieldTPerHa: double(),
    /** Where the soybean yield figure comes from, in the user's words. */
    soybeanYieldSource: varchar({ length: 300 }),
    soybeanCpPct: double(),
    weeksPerYear: int(),
    version: int().notNull().default(1),
    createdByUserId: varchar({ length: 40 }).references(() => users.id, { onDelete: 'set null' }),
    createdAt: timestamp().notNull().defaultNow(),
    updatedAt: timestamp().notNull().defaultNow().onUpdateNow(),
  },
  (t) => [index('supply_plans_org').on(t.organizationId, t.name)],
);

/** One by-product stream of a plan, in the order the user listed them. Null factors use the substrate's default. */
export const supplyStreams = mysqlTable(
  'supply_streams',
  {
    id: int().autoincrement().primaryKey(),
    planId: int().notNull().references(() => supplyPlans.id, { onDelete: 'cascade' }),
    position: int().notNull(),
    name: varchar({ length: 160 }).notNull(),
    substrate: mysqlEnum(SUBSTRATE_KINDS).notNull(),
    /** Fresh substrate as delivered, t per week. */
    tonnesPerWeek: double().notNull(),
    moisturePct: double(),
    substrateCpDmPct: double(),
    bioconversionDmPct: double(),
    residueDmPct: double(),
    larvaeDryMatterPct: double(),
    /** For animal-origin or mixed substrates: the animals it came from. */
    animals: json().$type<OriginAnimal[]>(),
  },
  (t) => [index('supply_streams_plan').on(t.planId, t.position)],
);

export type SupplyPlanRow = typeof supplyPlans.$inferSelect;
export type NewSupplyPlanRow = typeof supplyPlans.$inferInsert;
export type SupplyStreamRow = typeof supplyStreams.$inferSelect;
export type NewSupplyStreamRow = typeof supplyStreams.$inferInsert;
