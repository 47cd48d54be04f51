/**
 * Contracts of /api/batch-sheets and /api/batches. The batch size, scale steps and amounts travel in the
 * organization's mass unit (kg or lb, see /api/organization-settings); the batch log stores kg.
 */
import { z } from 'zod';

import type { BatchSheet } from '../batch-sheet';
import type { Measures } from '../measures';
import type { VersionSummary } from './formulas';

const positive = (what: string, max: number) => z.coerce.number({ message: `${what} must be a number` }).gt(0, `${what} must be more than 0`).max(max, `${what} must be at most ${max.toLocaleString('en')}`);

/** GET /api/batch-sheets/:versionId?batchSize=&macroStep=&minorStep=: sizes in the organization's unit; default batch: the formula's. */
export const batchSheetQuery = z.object({
  batchSize: positive('the batch size', 2_000_000).optional(),
  macroStep: positive('the main scale step', 1000).optional(),
  minorStep: positive('the small scale step', 100).optional(),
});

export const versionIdParams = z.object({ versionId: z.coerce.number({ message: 'must be a number' }).int().positive() });

/** POST /api/batches: a batch made from the current approved version. */
export const recordBatchInput = z.strictObject({
  versionId: z.number({ message: 'choose the formula version' }).int().positive(),
  madeOn: z.string({ message: 'enter the date it was made' }).regex(/^\d{4}-\d{2}-\d{2}$/, 'write the date as YYYY-MM-DD'),
  /** In the organization's unit (kg or lb). */
  batchSize: z.number({ message: 'enter the batch size' }).gt(0, 'the batch size must be more than 0').max(2_000_000, 'the batch size must be at most 2,000,000'),
  operatorName: z.string({ message: 'enter the operator’s name or initials' }).trim().min(1, 'enter the operator’s name or initials').max(120, 'at most 120 characters'),
  deviation: z.string().trim().max(1000, 'at most 1,000 characters').nullish(),
});
export type RecordBatchInput = z.input<typeof recordBatchInput>;

export const listBatchesQuery = z.object({ versionId: z.coerce.number().int().positive().optional() });

/** The answer of GET /api/batch-sheets/:versionId. */
export type BatchSheetResponse = {
  formulaId: number;
  formulaName: string;
  version: VersionSummary;
  species: string | null;
  specification: { name: string; source: string } | null;
  measures: Measures;
  /** The unit of every amount in `sheet`. */
  massUnit: 'kg' | 'lb';
  /** The formula's own batch, in `massUnit`. */
  formulaBatchSize: number;
  sheet: BatchSheet;
  /** Cost of this batch at the version's prices, in `measures.currency`. */
  costPerBatch: number;
  capWarnings: string[];
};

/** One batch made, as the log shows it (amounts in the organization's unit). */
export type BatchLogEntry = {
  id: number;
  formulaId: number | null;
  versionId: number | null;
  formulaName: string;
  versionNumber: number;
  madeOn: string;
  batchSize: number;
  massUnit: 'kg' | 'lb';
  operatorName: string;
  deviation: string | null;
  recordedAt: string;
};
