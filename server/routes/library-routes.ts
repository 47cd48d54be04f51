import { Router } from 'express';

import type { Db } from '../db/client';
import { ingredientsRouter } from './ingredients';
import { nutrientsRouter } from './nutrients';
import { pricesRouter } from './prices';
import { speciesRouter } from './species';
import { specificationsRouter } from './specifications';

/** The nutrient library and requirement routes, mounted together under /api. */
export function libraryRoutes({ db }: { db: Db }): Router {
  const router = Router();
  router.use('/nutrients', nutrientsRouter({ db }));
  router.use('/ingredients', ingredientsRouter({ db }));
  router.use('/prices', pricesRouter({ db }));
  router.use('/species', speciesRouter({ db }));
  router.use('/specifications', specificationsRouter({ db }));
  return router;
}
