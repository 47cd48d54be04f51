import { and, desc, eq } from 'drizzle-orm';
import Papa from 'papaparse';
import type { z } from 'zod';

import { ADDITION_GROUP_LABELS, buildBatchSheet } from '../../../src/shared/batch-sheet';
import { ingredientKey } from '../../../src/shared/formula-problem';
import { massFromKg, massToKg, massUnit, stepDecimals } from '../../../src/shared/measures';
import type { BatchLogEntry, BatchSheetResponse, batchSheetQuery, recordBatchInput } from '../../../src/shared/schemas/batch-sheets';
import { badRequest, HttpError } from '../../http/errors';
import type { Db } from '../client';
import { batchLogs, type BatchLogRow } from '../schema';
import { formulaArchival, getApprovedVersion } from './formulas';
import { getMeasures } from './organization-settings';

/** Default scale steps in the organization's unit: 0.5 kg / 1 lb on the main scale, 0.01 on the small one. */
const DEFAULT_STEPS = { metric: { macro: 0.5, minor: 0.01 }, us: { macro: 1, minor: 0.01 } } as const;

/**
 * The batch sheet of a current approved version for a batch size in the organization's unit (default:
 * the formula's batch). Another organization's version, a draft or a superseded approval answers 404.
 */
export async function getBatchSheet(db: Db, organizationId: number, versionId: number, q: z.output<typeof batchSheetQuery>): Promise<BatchSheetResponse> {
  const version = await getApprovedVersion(db, organizationId, versionId);
  const measures = await getMeasures(db, organizationId);
  const { snapshot: s, ...summary } = version;
  const r = s.result;
  if (r.status !== 'optimal') throw new HttpError(409, 'no_mix', 'This version has no mix, so it has no batch sheet.');
  const system = measures.unitSystem;
  const formulaBatchSize = Number(massFromKg(r.batchKg, system).toFixed(system === 'us' ? 0 : 3));
  const batchSize = q.batchSize ?? formulaBatchSize;
  const macroStep = q.macroStep ?? DEFAULT_STEPS[system].macro;
  const minorStep = q.minorStep ?? DEFAULT_STEPS[system].minor;
  if (minorStep > macroStep) throw badRequest('minorStep: the small scale step must not be larger than the main scale step', { minorStep: ['must not be larger than the main scale step'] });
  const byKey = new Map(s.ingredients.map((u) => [ingredientKey(u.ingredientId), u]));
  const sheet = buildBatchSheet(
    r.mix.map((m) => ({ id: m.id, name: m.name ?? byKey.get(m.id)?.name ?? m.id, category: byKey.get(m.id)?.category ?? 'cereal_grain', percent: m.percent })),
    { batchSize, macroStep, minorStep },
  );
  return {
    formulaId: version.formulaId,
    formulaName: s.formulaName,
    version: summary,
    species: s.species?.name ?? null,
    specification: s.specification ? { name: s.specification.name, source: s.specification.source } : null,
    measures,
    massUnit: massUnit(system),
    formulaBatchSize,
    sheet,
    costPerBatch: r.costPerKg * massToKg(batchSize, system),
    capWarnings: s.capWarnings.map((w) => w.message),
  };
}

/** The batch sheet as CSV (papaparse): one row per ingredient in the order of addition, then the total. */
export function batchSheetCsv(b: BatchSheetResponse): string {
  const unit = b.massUnit;
  const rows: (string | number)[][] = [
    ['Troughline batch sheet. Decision support only: a veterinarian or qualified animal nutritionist must review a diet before it is fed.'],
    ['Formula', b.formulaName, 'Version', b.version.number, 'Approved by', b.version.approvedBy ?? '', 'Approved on', (b.version.approvedAt ?? '').slice(0, 10)],
    ['Batch size', b.sheet.batchSize, unit, 'Cost of batch', b.costPerBatch.toFixed(2), b.measures.currency],
    [],
    ['Order', 'Ingredient', 'Group', `Amount (${unit})`, `Scale step (${unit})`, 'Share of batch (%)', 'Note'],
    ...b.sheet.lines.map((l) => [l.order, l.name, ADDITION_GROUP_LABELS[l.group], l.amount.toFixed(l.decimals), l.step, l.percent.toFixed(3), l.callOut ?? '']),
    ['', 'Total', '', b.sheet.total.toFixed(Math.max(stepDecimals(b.sheet.macroStep), stepDecimals(b.sheet.minorStep))), '', '', `difference from the batch size: ${b.sheet.difference} ${unit}`],
    [],
    ['Operator initials', '', 'Date made', '', 'Deviation', ''],
  ];
  return Papa.unparse(rows, { newline: '\r\n' });
}

function toEntry(row: BatchLogRow, system: 'metric' | 'us'): BatchLogEntry {
  return {
    id: row.id,
    formulaId: row.formulaId,
    versionId: row.versionId,
    formulaName: row.formulaName,
    versionNumber: row.versionNumber,
    madeOn: row.madeOn,
    batchSize: Number(massFromKg(row.batchKg, system).toFixed(6)),
    massUnit: massUnit(system),
    operatorName: row.operatorName,
    deviation: row.deviation,
    recordedAt: row.createdAt.toISOString(),
  };
}

/** Records a batch as made from the current approved version; the amount is kept in kg. */
export async function recordBatch(db: Db, organizationId: number, userId: string, input: z.output<typeof recordBatchInput>): Promise<BatchLogEntry> {
  const version = await getApprovedVersion(db, organizationId, input.versionId);
  const { unitSystem } = await getMeasures(db, organizationId);
  if (input.madeOn > new Date(Date.now() + 36 * 3600_000).toISOString().slice(0, 10)) throw badRequest('madeOn: a batch cannot be made in the future', { madeOn: ['a batch cannot be made in the future'] });
  // A batch mixed before the formula was archived may still be logged late; a later one means the mill is
  // making a formula it retired, which a nutritionist has to restore first.
  const archival = await formulaArchival(db, organizationId, version.formulaId);
  if (archival && input.madeOn > archival.on) {
    throw new HttpError(409, 'archived', `archived: “${archival.name}” was archived by ${archival.by} on ${archival.on}, so only batches made on or before that day can be recorded. Ask a nutritionist to restore it if the mill makes it again.`);
  }
  const [{ id }] = await db
    .insert(batchLogs)
    .values({
      organizationId,
      formulaId: version.formulaId,
      versionId: version.id,
      formulaName: version.snapshot.formulaName,
      versionNumber: version.number,
      madeOn: input.madeOn,
      batchKg: massToKg(input.batchSize, unitSystem),
      operatorName: input.operatorName,
      deviation: input.deviation || null,
      recordedByUserId: userId,
    })
    .$returningId();
  const [row] = await db.select().from(batchLogs).where(eq(batchLogs.id, id));
  return toEntry(row, unitSystem);
}

export async function listBatches(db: Db, organizationId: number, versionId?: number): Promise<BatchLogEntry[]> {
  const { unitSystem } = await getMeasures(db, organizationId);
  const where = versionId ? and(eq(batchLogs.organizationId, organizationId), eq(batchLogs.versionId, versionId)) : eq(batchLogs.organizationId, organizationId);
  const rows = await db.select().from(batchLogs).where(where).orderBy(desc(batchLogs.madeOn), desc(batchLogs.id)).limit(200);
  return rows.map((r) => toEntry(r, unitSystem));
}

