import { Router } from 'express';

import { batchSheetQuery, versionIdParams } from '../../src/shared/schemas/batch-sheets';
import type { Db } from '../db/client';
import { batchSheetCsv, getBatchSheet } from '../db/queries/batches';
import { access, requireMembership } from '../http/access';

/** Batch sheets of the current approved versions, for whoever may read approved formulas (mill operators too). */
export function batchSheetsRouter({ db }: { db: Db }): Router {
  const router = Router();

  router.get('/:versionId', access.member('formulas:read-approved'), async (req, res) => {
    const { organizationId } = requireMembership(req);
    res.json(await getBatchSheet(db, organizationId, versionIdParams.parse(req.params).versionId, batchSheetQuery.parse(req.query)));
  });

  router.get('/:versionId/csv', access.member('formulas:read-approved'), async (req, res) => {
    const { organizationId } = requireMembership(req);
    const sheet = await getBatchSheet(db, organizationId, versionIdParams.parse(req.params).versionId, batchSheetQuery.parse(req.query));
    const name = `batch-${sheet.formulaName.replace(/[^A-Za-z0-9]+/g, '-').toLowerCase()}-v${sheet.version.number}-${sheet.sheet.batchSize}${sheet.massUnit}.csv`;
    res.type('text/csv; charset=utf-8').attachment(name).send(batchSheetCsv(sheet));
  });

  return router;
}
