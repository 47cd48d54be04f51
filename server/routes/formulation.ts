import { Router } from 'express';

import { allocate } from '../../src/shared/engine/allocate';
import { evaluateMix } from '../../src/shared/engine/evaluate';
import { solveFormula } from '../../src/shared/engine/formulate';
import type { LpSolver } from '../../src/shared/engine/lp-types';
import { priceSweep } from '../../src/shared/engine/price-sweep';
import {
  allocationProblemSchema,
  evaluationProblemSchema,
  formulaProblemSchema,
  priceSweepSchema,
} from '../../src/shared/schemas/formulation';
import { access } from '../http/access';
import { getHighsSolver } from '../lp/highs-solver';

/** Options for {@link formulationRouter}. */
export interface FormulationRouterOptions {
  /** Sparse solver used as the allocation fallback (default: HiGHS, loaded on first use). */
  largeSolver?: () => Promise<LpSolver>;
}

/**
 * Formulation endpoints (mount at /api behind authentication). Bodies are JSON in the formats of
 * src/shared/engine/README.md and are validated with zod: a ZodError is thrown for the error
 * middleware to answer 400 `invalid_input` with `fieldErrors`. An infeasible problem is a
 * 200 response with `status: 'infeasible'`, never an error.
 *
 * - POST /solve               least-cost mix, shadow prices, price ranging, infeasibility explained
 * - POST /solve/evaluate      levels, cost and missed bounds of a given mix
 * - POST /solve/allocate      several formulas from shared stocks
 * - POST /solve/price-sweep   cost and inclusion over a range of one ingredient's price
 */
export function formulationRouter(options: FormulationRouterOptions = {}): Router {
  const router = Router();
  const large = options.largeSolver ?? getHighsSolver;

  router.post('/solve', access.member('formulas:solve'), (req, res) => {
    const problem = formulaProblemSchema.parse(req.body);
    res.json(solveFormula(problem, { trusted: true }));
  });

  router.post('/solve/evaluate', access.member('ration:check'), (req, res) => {
    evaluationProblemSchema.parse(req.body);
    res.json(evaluateMix(req.body));
  });

  router.post('/solve/allocate', access.member('formulas:solve'), async (req, res) => {
    const problem = allocationProblemSchema.parse(req.body);
    // HiGHS is the fallback when the decomposition fails and serves the diagnosis of a large infeasible allocation.
    res.json(allocate(problem, { trusted: true, largeSolver: await large() }));
  });

  router.post('/solve/price-sweep', access.member('formulas:solve'), (req, res) => {
    priceSweepSchema.parse(req.body);
    res.json(priceSweep(req.body));
  });

  return router;
}
