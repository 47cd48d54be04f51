import { Router } from 'express';

import { listBatchesQuery, recordBatchInput } from '../../src/shared/schemas/batch-sheets';
import type { Db } from '../db/client';
import { listBatches, recordBatch } from '../db/queries/batches';
import { access, requireMembership } from '../http/access';

/** The batch log: operators and owners record batches made; whoever reads approved formulas reads the log. */
export function batchesRouter({ db }: { db: Db }): Router {
  const router = Router();

  router.get('/', access.member('formulas:read-approved'), async (req, res) => {
    const { organizationId } = requireMembership(req);
    res.json(await listBatches(db, organizationId, listBatchesQuery.parse(req.query).versionId));
  });

  router.post('/', access.member('batches:record'), async (req, res) => {
    const { organizationId, userId } = requireMembership(req);
    res.status(201).json(await recordBatch(db, organizationId, userId, recordBatchInput.parse(req.body)));
  });

  return router;
}
