import { boolean, double, index, int, mysqlEnum, mysqlTable, text, timestamp, uniqueIndex, varchar } from 'drizzle-orm/mysql-core';

import { CAP_SCOPES, CONFIDENCE_LEVELS, INGREDIENT_CATEGORIES, INSECT_SPECIES, SPECIES_FAMILIES } from '../../../src/shared/library-terms';
import { ingredients, nutrients } from './library';
import { organizations } from './organizations';

/** A kind of animal a diet is made for (broiler chicken, sow...). Null organization: the reference list. */
export const species = mysqlTable('species', {
  id: int().autoincrement().primaryKey(),
  organizationId: int().references(() => organizations.id, { onDelete: 'cascade' }),
  code: varchar({ length: 40 }).notNull(),
  name: varchar({ length: 120 }).notNull(),
  family: mysqlEnum(SPECIES_FAMILIES).notNull(),
  sortOrder: int().notNull().default(100),
});

/** A production phase of a species, by age or by body weight, or by state (gestation, lactation). */
export const phases = mysqlTable(
  'phases',
  {
    id: int().autoincrement().primaryKey(),
    speciesId: int().notNull().references(() => species.id, { onDelete: 'cascade' }),
    organizationId: int().references(() => organizations.id, { onDelete: 'cascade' }),
    name: varchar({ length: 120 }).notNull(),
    /** The span in words, e.g. "0–21 days" or "11–25 kg". */
    span: varchar({ length: 120 }),
    ageFromDays: int(),
    ageToDays: int(),
    bodyWeightFromKg: double(),
    bodyWeightToKg: double(),
    sortOrder: int().notNull().default(100),
  },
  (t) => [index('phases_species').on(t.speciesId)],
);

/**
 * A requirement specification: nutrient bounds, ratios and inclusion caps for one species and phase.
 * Null organization: a reference specification from a named published table, read-only.
 */
export const specifications = mysqlTable(
  'specifications',
  {
    id: int().autoincrement().primaryKey(),
    organizationId: int().references(() => organizations.id, { onDelete: 'cascade' }),
    code: varchar({ length: 60 }),
    copiedFromId: int(),
    speciesId: int().notNull().references(() => species.id),
    phaseId: int().references(() => phases.id, { onDelete: 'set null' }),
    name: varchar({ length: 160 }).notNull(),
    /** The published table the bounds come from, or who set them. */
    source: varchar({ length: 300 }).notNull(),
    notes: text(),
    /** Feed intake the % bounds assume, g per animal per day (layers). */
    feedIntakeGPerDay: double(),
    version: int().notNull().default(1),
    createdAt: timestamp().notNull().defaultNow(),
    updatedAt: timestamp().notNull().defaultNow().onUpdateNow(),
  },
  (t) => [index('specifications_org_species').on(t.organizationId, t.speciesId)],
);

/** Minimum and/or maximum of one nutrient in the finished feed, as fed, in the nutrient's unit. Null confidence: set by the organization. */
export const specificationNutrients = mysqlTable(
  'specification_nutrients',
  {
    id: int().autoincrement().primaryKey(),
    specificationId: int().notNull().references(() => specifications.id, { onDelete: 'cascade' }),
    nutrientId: varchar({ length: 40 }).notNull().references(() => nutrients.id),
    min: double(),
    max: double(),
    confidence: mysqlEnum(CONFIDENCE_LEVELS),
    note: varchar({ length: 300 }),
  },
  (t) => [uniqueIndex('spec_nutrients_unique').on(t.specificationId, t.nutrientId)],
);

/** Bounds on numerator ÷ denominator in the finished feed (e.g. Ca : available P). */
export const specificationRatios = mysqlTable('specification_ratios', {
  id: int().autoincrement().primaryKey(),
  specificationId: int().notNull().references(() => specifications.id, { onDelete: 'cascade' }),
  numeratorId: varchar({ length: 40 }).notNull().references(() => nutrients.id),
  denominatorId: varchar({ length: 40 }).notNull().references(() => nutrients.id),
  min: double(),
  max: double(),
  confidence: mysqlEnum(CONFIDENCE_LEVELS),
  note: varchar({ length: 300 }),
});

/**
 * Inclusion limits, % of the feed, for one ingredient, a category or the meals of one insect. `soft`
 * caps are tested levels from feeding trials: exceeding one warns and never blocks.
 */
export const specificationCaps = mysqlTable('specification_caps', {
  id: int().autoincrement().primaryKey(),
  specificationId: int().notNull().references(() => specifications.id, { onDelete: 'cascade' }),
  scope: mysqlEnum(CAP_SCOPES).notNull(),
  ingredientId: int().references(() => ingredients.id, { onDelete: 'cascade' }),
  category: mysqlEnum(INGREDIENT_CATEGORIES),
  insectSpecies: mysqlEnum(INSECT_SPECIES),
  minPct: double(),
  maxPct: double(),
  soft: boolean().notNull().default(true),
  /** The study or practice the cap comes from. */
  source: varchar({ length: 300 }).notNull(),
  note: varchar({ length: 300 }),
});

export type SpeciesRow = typeof species.$inferSelect;
export type PhaseRow = typeof phases.$inferSelect;
export type SpecificationRow = typeof specifications.$inferSelect;
export type NewSpecificationRow = typeof specifications.$inferInsert;
export type SpecificationNutrientRow = typeof specificationNutrients.$inferSelect;
export type SpecificationRatioRow = typeof specificationRatios.$inferSelect;
export type SpecificationCapRow = typeof specificationCaps.$inferSelect;
