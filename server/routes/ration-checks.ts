import { Router } from 'express';

import { rationCheckInput } from '../../src/shared/schemas/ration-checks';
import type { Db } from '../db/client';
import { rationChoices, runRationCheck } from '../db/queries/ration-checks';
import { access, requireMembership } from '../http/access';

/** "Check my ration" on a phone: nothing is saved; sharing a check goes through /api/shares. */
export function rationChecksRouter({ db }: { db: Db }): Router {
  const router = Router();

  router.get('/choices', access.member('ration:check'), async (req, res) => {
    const { organizationId } = requireMembership(req);
    res.json(await rationChoices(db, organizationId));
  });

  router.post('/', access.member('ration:check'), async (req, res) => {
    const { organizationId } = requireMembership(req);
    res.json(await runRationCheck(db, organizationId, rationCheckInput.parse(req.body)));
  });

  return router;
}
