import { Router } from 'express';

import { listNutrientsQuery } from '../../src/shared/schemas/nutrients';
import type { Db } from '../db/client';
import { listNutrients } from '../db/queries/nutrients';
import { access, requireMembership } from '../http/access';

/** The nutrient catalogue, shared by every organization and read-only. */
export function nutrientsRouter({ db }: { db: Db }): Router {
  const router = Router();

  router.get('/', access.member('library:read'), async (req, res) => {
    requireMembership(req);
    res.json(await listNutrients(db, listNutrientsQuery.parse(req.query)));
  });

  return router;
}
