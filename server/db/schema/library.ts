import { date, decimal, double, index, int, json, mysqlEnum, mysqlTable, primaryKey, text, timestamp, varchar } from 'drizzle-orm/mysql-core';

import {
  AMINO_ACID_BASES,
  CONFIDENCE_LEVELS,
  INGREDIENT_CATEGORIES,
  INSECT_PROCESSING,
  INSECT_SPECIES,
  NUTRIENT_GROUPS,
  NUTRIENT_UNITS,
  SUBSTRATE_ORIGINS,
  VALUE_SOURCE_KINDS,
  type OriginAnimal,
  type SpeciesFamily,
} from '../../../src/shared/library-terms';
import { users } from './accounts';
import { organizations } from './organizations';

/**
 * Decimal places kept for prices per kg. Ten, so a price typed per lb (or any other unit) converts to per kg and back
 * without a visible change: 1.00 per lb is 2.2046226218 per kg.
 */
export const PRICE_SCALE = 10;

/** A price per kg as the decimal column takes it. */
export const priceColumn = (pricePerKg: number): string => pricePerKg.toFixed(PRICE_SCALE);

/**
 * The nutrient catalogue, shared by every organization. Ids are short stable codes (`cp`, `sid_lys`) that
 * formulas and the engine use as keys. Each amino-acid basis is its own nutrient, so bases never mix.
 */
export const nutrients = mysqlTable('nutrients', {
  id: varchar({ length: 40 }).primaryKey(),
  name: varchar({ length: 120 }).notNull(),
  unit: mysqlEnum(NUTRIENT_UNITS).notNull(),
  nutrientGroup: mysqlEnum(NUTRIENT_GROUPS).notNull(),
  /** Diet families that use this nutrient (e.g. AMEn: poultry; NE: swine). */
  families: json().$type<SpeciesFamily[]>().notNull(),
  /** For amino acids: the basis of the value (total, poultry digestible, swine SID). */
  basis: mysqlEnum(AMINO_ACID_BASES),
  sortOrder: int().notNull(),
  description: varchar({ length: 300 }),
});

/**
 * An ingredient in a library. `organizationId` null is the read-only reference library; an organization's
 * own rows start as copies (`copiedFromId`) and then diverge. `version` rises with every change, so a
 * formula can say which state of the ingredient it was solved with.
 */
export const ingredients = mysqlTable(
  'ingredients',
  {
    id: int().autoincrement().primaryKey(),
    organizationId: int().references(() => organizations.id, { onDelete: 'cascade' }),
    /** Stable key of a reference row, so later library versions can find it. */
    code: varchar({ length: 60 }),
    copiedFromId: int(),
    name: varchar({ length: 160 }).notNull(),
    category: mysqlEnum(INGREDIENT_CATEGORIES).notNull(),
    notes: text(),
    insectSpecies: mysqlEnum(INSECT_SPECIES),
    insectProcessing: mysqlEnum(INSECT_PROCESSING),
    /** What the larvae were reared on, in words (e.g. "brewery spent grains"). */
    substrate: varchar({ length: 200 }),
    substrateOrigin: mysqlEnum(SUBSTRATE_ORIGINS),
    substrateAnimals: json().$type<OriginAnimal[]>(),
    /** Current price per kg as fed, and the day it was set; the history is in ingredient_prices. */
    pricePerKg: decimal({ precision: 20, scale: PRICE_SCALE }),
    priceDate: date({ mode: 'string' }),
    version: int().notNull().default(1),
    createdAt: timestamp().notNull().defaultNow(),
    updatedAt: timestamp().notNull().defaultNow().onUpdateNow(),
  },
  (t) => [index('ingredients_org_name').on(t.organizationId, t.name), index('ingredients_org_category').on(t.organizationId, t.category)],
);

/** Where a group of an ingredient's values came from, and the dry matter those as-fed values refer to. */
export const ingredientValueSets = mysqlTable(
  'value_sets',
  {
    id: int().autoincrement().primaryKey(),
    ingredientId: int().notNull().references(() => ingredients.id, { onDelete: 'cascade' }),
    sourceKind: mysqlEnum(VALUE_SOURCE_KINDS).notNull(),
    /** The table, study or lab report, named so a reader can find it. */
    sourceName: varchar({ length: 300 }).notNull(),
    confidence: mysqlEnum(CONFIDENCE_LEVELS).notNull(),
    /** Date of the lab analysis (lab sets only). */
    analysedOn: date({ mode: 'string' }),
    dryMatterPct: double().notNull(),
    note: varchar({ length: 500 }),
    createdAt: timestamp().notNull().defaultNow(),
  },
  (t) => [index('value_sets_ingredient').on(t.ingredientId)],
);

/** One nutrient value per ingredient, per kg as fed, belonging to the value set it came from. */
export const ingredientNutrientValues = mysqlTable(
  'ingredient_values',
  {
    ingredientId: int().notNull().references(() => ingredients.id, { onDelete: 'cascade' }),
    nutrientId: varchar({ length: 40 }).notNull().references(() => nutrients.id),
    valueSetId: int().notNull().references(() => ingredientValueSets.id, { onDelete: 'cascade' }),
    value: double().notNull(),
  },
  (t) => [primaryKey({ columns: [t.ingredientId, t.nutrientId] }), index('values_set').on(t.valueSetId)],
);

/** Every price an ingredient has had, newest by `effectiveOn` first when read. */
export const ingredientPrices = mysqlTable(
  'ingredient_prices',
  {
    id: int().autoincrement().primaryKey(),
    ingredientId: int().notNull().references(() => ingredients.id, { onDelete: 'cascade' }),
    pricePerKg: decimal({ precision: 20, scale: PRICE_SCALE }).notNull(),
    effectiveOn: date({ mode: 'string' }).notNull(),
    recordedByUserId: varchar({ length: 40 }).references(() => users.id, { onDelete: 'set null' }),
    recordedAt: timestamp().notNull().defaultNow(),
  },
  (t) => [index('prices_ingredient_date').on(t.ingredientId, t.effectiveOn)],
);

export type NutrientRow = typeof nutrients.$inferSelect;
export type NewNutrientRow = typeof nutrients.$inferInsert;
export type IngredientRow = typeof ingredients.$inferSelect;
export type NewIngredientRow = typeof ingredients.$inferInsert;
export type IngredientValueSetRow = typeof ingredientValueSets.$inferSelect;
export type NewIngredientValueSetRow = typeof ingredientValueSets.$inferInsert;
export type IngredientNutrientValueRow = typeof ingredientNutrientValues.$inferSelect;
export type IngredientPriceRow = typeof ingredientPrices.$inferSelect;
