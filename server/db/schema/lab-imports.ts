import { date, double, index, int, json, mediumtext, mysqlEnum, mysqlTable, timestamp, uniqueIndex, varchar } from 'drizzle-orm/mysql-core';

import type { ColumnMapping, LabValue } from '../../../src/shared/lab-import/types';
import { users } from './accounts';
import { ingredients } from './library';
import { organizations } from './organizations';

/**
 * A lab file as it was uploaded and saved: the raw text is kept unchanged with who uploaded it, the
 * lab, how it was read (separator, decimal mark, layout, mapping) and how gaps were filled.
 */
export const labImports = mysqlTable(
  'lab_imports',
  {
    id: int().autoincrement().primaryKey(),
    organizationId: int().notNull().references(() => organizations.id, { onDelete: 'cascade' }),
    uploadedByUserId: varchar({ length: 40 }).references(() => users.id, { onDelete: 'set null' }),
    labName: varchar({ length: 200 }).notNull(),
    fileName: varchar({ length: 255 }).notNull(),
    fileBytes: int().notNull(),
    /** The file's text exactly as uploaded (at most 2 MB). */
    rawText: mediumtext().notNull(),
    layout: mysqlEnum(['sample_per_row', 'nutrient_per_row']).notNull(),
    delimiter: varchar({ length: 2 }).notNull(),
    decimalMark: varchar({ length: 1 }).notNull(),
    mapping: json().$type<ColumnMapping>().notNull(),
    /** Ingredient class used for gap filling, and a poultry equation chosen instead of the class's own. */
    estimationClass: varchar({ length: 60 }).notNull(),
    poultryEquation: varchar({ length: 60 }),
    createdAt: timestamp().notNull().defaultNow(),
  },
  (t) => [index('lab_imports_org_created').on(t.organizationId, t.createdAt)],
);

/**
 * One lab analysis of an ingredient, from an imported file (a sample of the file) or typed in on the
 * ingredient's page: a dated analysis whose values (as fed, each marked measured, calculated, estimated
 * with its method, or entered over an estimate) stay here even after later analyses replace them in the
 * library, so the analyses of one ingredient can be compared and every library value traced.
 */
export const labImportAnalyses = mysqlTable(
  'lab_import_analyses',
  {
    id: int().autoincrement().primaryKey(),
    /** The file the analysis came in; null for an analysis typed in by hand. */
    labImportId: int().references(() => labImports.id, { onDelete: 'cascade' }),
    organizationId: int().notNull().references(() => organizations.id, { onDelete: 'cascade' }),
    ingredientId: int().notNull().references(() => ingredients.id, { onDelete: 'cascade' }),
    /** `file`: a sample of an imported file; `typed`: typed in by hand. */
    entry: mysqlEnum(['file', 'typed']).notNull().default('file'),
    /** The laboratory or report. Null on analyses imported before it was kept here: the import's lab name. */
    laboratory: varchar({ length: 200 }),
    /** Who recorded it. Null on analyses imported before it was kept here: the import's uploader. */
    recordedByUserId: varchar({ length: 40 }).references(() => users.id, { onDelete: 'set null' }),
    /** True when this sample created the ingredient. */
    createdIngredient: int().notNull().default(0),
    /** The lab's sample or report number; may be missing for a typed analysis. */
    sampleId: varchar({ length: 120 }),
    sampleName: varchar({ length: 200 }),
    analysedOn: date({ mode: 'string' }).notNull(),
    dryMatterPct: double().notNull(),
    values: json().$type<LabValue[]>().notNull(),
    /**
     * The nutrients whose values went into the library when the analysis was recorded (a value held by a
     * later-dated analysis is kept). Null on analyses saved before this was recorded: all were applied.
     */
    appliedNutrientIds: json().$type<string[]>(),
    createdAt: timestamp().notNull().defaultNow(),
  },
  (t) => [index('lab_analyses_ingredient').on(t.organizationId, t.ingredientId, t.analysedOn), index('lab_analyses_import').on(t.labImportId)],
);

/** The mapping last saved for a lab, per organization, offered first the next time that lab's file comes in. */
export const labColumnMappings = mysqlTable(
  'lab_column_mappings',
  {
    id: int().autoincrement().primaryKey(),
    organizationId: int().notNull().references(() => organizations.id, { onDelete: 'cascade' }),
    /** The lab's name in lower case with spaces collapsed: "Feed Lab" and "feed  lab" are one lab. */
    labKey: varchar({ length: 200 }).notNull(),
    labName: varchar({ length: 200 }).notNull(),
    mapping: json().$type<ColumnMapping>().notNull(),
    updatedByUserId: varchar({ length: 40 }).references(() => users.id, { onDelete: 'set null' }),
    updatedAt: timestamp().notNull().defaultNow().onUpdateNow(),
  },
  (t) => [uniqueIndex('lab_mappings_org_lab').on(t.organizationId, t.labKey)],
);

export type LabImportRow = typeof labImports.$inferSelect;
export type NewLabImportRow = typeof labImports.$inferInsert;
export type LabImportAnalysisRow = typeof labImportAnalyses.$inferSelect;
export type LabColumnMappingRow = typeof labColumnMappings.$inferSelect;
