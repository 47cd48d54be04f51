import { Router } from 'express';

import { listPricesQuery, recordPricesInput } from '../../src/shared/schemas/prices';
import type { Db } from '../db/client';
import { listPrices, recordPrices } from '../db/queries/prices';
import { access, requireMembership } from '../http/access';

/** Price history of an ingredient, and the weekly update of many prices at once (all saved or none). */
export function pricesRouter({ db }: { db: Db }): Router {
  const router = Router();

  router.get('/', access.member('library:read'), async (req, res) => {
    const { organizationId } = requireMembership(req);
    res.json(await listPrices(db, organizationId, listPricesQuery.parse(req.query)));
  });

  router.post('/', access.member('library:write'), async (req, res) => {
    const { organizationId, userId } = requireMembership(req);
    res.status(201).json(await recordPrices(db, organizationId, userId, recordPricesInput.parse(req.body)));
  });

  return router;
}
