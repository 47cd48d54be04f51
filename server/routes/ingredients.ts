import { Router } from 'express';

import { copyIngredientInput, createIngredientInput, labAnalysisInput, listIngredientsQuery, updateIngredientInput } from '../../src/shared/schemas/ingredients';
import { idParams } from '../../src/shared/schemas/library-common';
import type { Db } from '../db/client';
import { copyIngredient, copyReferenceLibrary, createIngredient, deleteIngredient, getIngredient, listIngredients, updateIngredient } from '../db/queries/ingredients';
import { recordTypedAnalysis } from '../db/queries/lab-imports';
import { access, requireMembership } from '../http/access';

/**
 * Ingredients of the organization's own library (read and write) and of the reference library (read and
 * copy). Another organization's ingredient answers 404.
 */
export function ingredientsRouter({ db }: { db: Db }): Router {
  const router = Router();

  router.get('/', access.member('library:read'), async (req, res) => {
    const { organizationId } = requireMembership(req);
    res.json(await listIngredients(db, organizationId, listIngredientsQuery.parse(req.query)));
  });

  router.post('/copy-reference', access.member('library:write'), async (req, res) => {
    const { organizationId } = requireMembership(req);
    res.status(201).json({ copied: await copyReferenceLibrary(db, organizationId) });
  });

  router.get('/:id', access.member('library:read'), async (req, res) => {
    const { organizationId } = requireMembership(req);
    res.json(await getIngredient(db, organizationId, idParams.parse(req.params).id));
  });

  router.post('/', access.member('library:write'), async (req, res) => {
    const { organizationId, userId } = requireMembership(req);
    const id = await createIngredient(db, organizationId, userId, createIngredientInput.parse(req.body));
    res.status(201).json(await getIngredient(db, organizationId, id));
  });

  router.patch('/:id', access.member('library:write'), async (req, res) => {
    const { organizationId } = requireMembership(req);
    const { id } = idParams.parse(req.params);
    await updateIngredient(db, organizationId, id, updateIngredientInput.parse(req.body));
    res.json(await getIngredient(db, organizationId, id));
  });

  // 409 `in_use`, naming them, while a formula, a specification's limit or a supply plan uses it.
  router.delete('/:id', access.member('library:write'), async (req, res) => {
    const { organizationId } = requireMembership(req);
    await deleteIngredient(db, organizationId, idParams.parse(req.params).id);
    res.status(204).end();
  });

  router.post('/:id/copy', access.member('library:write'), async (req, res) => {
    const { organizationId } = requireMembership(req);
    const { id } = idParams.parse(req.params);
    const newId = await copyIngredient(db, organizationId, id, copyIngredientInput.parse(req.body ?? {}).name);
    res.status(201).json(await getIngredient(db, organizationId, newId));
  });

  // A lab analysis typed in by hand: recorded in the analysis history and applied like an imported one.
  router.post('/:id/lab-analyses', access.member('lab:import'), async (req, res) => {
    const { organizationId, userId } = requireMembership(req);
    const { id } = idParams.parse(req.params);
    res.status(201).json(await recordTypedAnalysis(db, organizationId, userId, id, labAnalysisInput.parse(req.body)));
  });

  return router;
}
