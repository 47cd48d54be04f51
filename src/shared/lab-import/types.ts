/**
 * Shapes shared by every step of a lab-analysis import: parsing, layout, mapping, conversion,
 * validation and gap filling. Pure data, no framework imports.
 */
import type { NutrientUnit } from '../library-terms';

export type Delimiter = ',' | ';' | '\t';
export type DecimalMark = '.' | ',';

/** `sample_per_row`: one sample per line, nutrients across. `nutrient_per_row`: one nutrient per line, samples across. */
export type Layout = 'sample_per_row' | 'nutrient_per_row';

/** Units a lab may report in. `ppm` is read as mg/kg. */
export const SOURCE_UNITS = ['%', 'g/kg', 'mg/kg', 'ppm', 'kcal/kg', 'MJ/kg', 'IU/kg'] as const;
export type SourceUnit = (typeof SOURCE_UNITS)[number];

/** The basis a lab reported a value on. */
export type ReportBasis = 'as_fed' | 'dry_matter';

/**
 * Auxiliary analyses Troughline does not keep as nutrients but uses: moisture gives the dry matter,
 * ADF and NDF feed the pig energy equations, cystine adds to methionine for Met + Cys.
 */
export const AUX_TARGETS = ['aux:moisture', 'aux:adf', 'aux:ndf', 'aux:cys', 'aux:nfe'] as const;
export type AuxTarget = (typeof AUX_TARGETS)[number];

/** Fields that describe the sample rather than measure it. */
export const SAMPLE_TARGETS = ['sample_id', 'sample_name', 'analysed_on'] as const;
export type SampleTarget = (typeof SAMPLE_TARGETS)[number];

/** What a column (or row) of the file is read as: a catalogue nutrient id, an auxiliary analysis, a sample field, or nothing. */
export type FieldTargetId = string;
export const IGNORE = 'ignore';

/** How one field of the file is read. */
export type FieldMapping = { target: FieldTargetId; unit: SourceUnit; basis: ReportBasis };
/** Field key (the header or row label as written in the file) → how it is read. */
export type ColumnMapping = Record<string, FieldMapping>;

/** A nutrient of the catalogue, as the import needs it. */
export type CatalogueNutrient = { id: string; name: string; unit: NutrientUnit };

/** Where in the file something is: the line (1 = the first line) and the column's header. */
export type CellPlace = { line: number | null; column: string | null };

/** A problem found in the file; any `error` stops the import and nothing is saved. */
export type LabIssue = CellPlace & { severity: 'error' | 'warning'; message: string };

/** One value read from the file. */
export type LabCell = { raw: string; line: number; column: string };

/** One field (a nutrient or sample detail) as the file names it. */
export type LabField = {
  key: string;
  /** Where the field is named: its header column (sample per row) or its row (nutrient per row). */
  line: number | null;
  column: string | null;
  /** Unit and basis stated in the file for this field (a unit column, or words in the header). */
  unitHint: SourceUnit | null;
  basisHint: ReportBasis | null;
};

/** One sample (a lab's specimen) with its raw cells by field key. */
export type LabSample = {
  /** 0-based position in the file. */
  index: number;
  /** Where the sample is: its line (sample per row) or its column (nutrient per row). */
  line: number | null;
  column: string | null;
  cells: Record<string, LabCell>;
};

export type LabTable = { layout: Layout; fields: LabField[]; samples: LabSample[] };

/** How an output value was obtained. */
export type ValueOrigin = 'measured' | 'calculated' | 'estimated' | 'override';

/** The method behind an estimated or calculated value, named for the reader. */
export type ValueMethod = { kind: 'equation' | 'coefficient' | 'sum'; id: string; name: string; source: string; confidence: 'verified' | 'derived' | 'from_memory'; caution?: string };

/** A value ready to store: per kg as fed in the catalogue unit, with its dry-matter equivalent. */
export type LabValue = {
  nutrientId: string;
  asFed: number;
  dryMatter: number;
  unit: NutrientUnit;
  origin: ValueOrigin;
  /** For measured values: the field, the number and unit and basis as the lab wrote them. */
  fieldKey?: string;
  reported?: { value: number; unit: SourceUnit; basis: ReportBasis };
  /** For estimated and calculated values: how. For overrides: the estimate replaced. */
  method?: ValueMethod;
  /** For overrides: what the estimate was (as fed). */
  estimatedAsFed?: number;
};
