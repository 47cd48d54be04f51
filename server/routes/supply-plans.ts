import { Router } from 'express';

import type { LpSolver } from '../../src/shared/engine/lp-types';
import { idParams } from '../../src/shared/schemas/library-common';
import { allocateSupplyInput, createSupplyPlanInput, updateSupplyPlanInput } from '../../src/shared/schemas/supply';
import type { Db } from '../db/client';
import { allocateSupply, allocationOptions, createSupplyPlan, deleteSupplyPlan, getSupplyPlan, listSupplyPlans, updateSupplyPlan } from '../db/queries/supply-plans';
import { access, requireMembership } from '../http/access';
import { getHighsSolver } from '../lp/highs-solver';

/**
 * Insect supply plans: by-product streams → larvae, frass and meal per week; and the week's allocation of
 * the meal over the formulas to be made (solved with and without the meal).
 */
export function supplyPlansRouter({ db, largeSolver = getHighsSolver }: { db: Db; largeSolver?: () => Promise<LpSolver> }): Router {
  const router = Router();

  router.get('/', access.member('supply:read'), async (req, res) => {
    const { organizationId } = requireMembership(req);
    res.json(await listSupplyPlans(db, organizationId));
  });

  router.get('/allocation-options', access.member('formulas:solve'), async (req, res) => {
    const { organizationId } = requireMembership(req);
    res.json(await allocationOptions(db, organizationId));
  });

  router.get('/:id', access.member('supply:read'), async (req, res) => {
    const { organizationId } = requireMembership(req);
    res.json(await getSupplyPlan(db, organizationId, idParams.parse(req.params).id));
  });

  router.post('/', access.member('supply:write'), async (req, res) => {
    const { organizationId, userId } = requireMembership(req);
    const id = await createSupplyPlan(db, organizationId, userId, createSupplyPlanInput.parse(req.body));
    res.status(201).json(await getSupplyPlan(db, organizationId, id));
  });

  router.put('/:id', access.member('supply:write'), async (req, res) => {
    const { organizationId } = requireMembership(req);
    const { id } = idParams.parse(req.params);
    await updateSupplyPlan(db, organizationId, id, updateSupplyPlanInput.parse(req.body));
    res.json(await getSupplyPlan(db, organizationId, id));
  });

  router.delete('/:id', access.member('supply:write'), async (req, res) => {
    const { organizationId } = requireMembership(req);
    await deleteSupplyPlan(db, organizationId, idParams.parse(req.params).id);
    res.status(204).end();
  });

  router.post('/:id/allocate', access.member('formulas:solve'), async (req, res) => {
    const { organizationId } = requireMembership(req);
    const { id } = idParams.parse(req.params);
    const input = allocateSupplyInput.parse(req.body);
    res.json(await allocateSupply(db, organizationId, id, input, await largeSolver()));
  });

  return router;
}
