import { Router } from 'express';

import { idParams } from '../../src/shared/schemas/library-common';
import { createPhaseInput, createSpeciesInput, listSpeciesQuery } from '../../src/shared/schemas/specifications';
import type { Db } from '../db/client';
import { createPhase, createSpecies, getSpecies, listSpecies } from '../db/queries/species';
import { access, requireMembership } from '../http/access';

/** Species and their production phases: the reference list plus the organization's own additions. */
export function speciesRouter({ db }: { db: Db }): Router {
  const router = Router();

  router.get('/', access.member('requirements:read'), async (req, res) => {
    const { organizationId } = requireMembership(req);
    res.json(await listSpecies(db, organizationId, listSpeciesQuery.parse(req.query)));
  });

  router.get('/:id', access.member('requirements:read'), async (req, res) => {
    const { organizationId } = requireMembership(req);
    res.json(await getSpecies(db, organizationId, idParams.parse(req.params).id));
  });

  router.post('/', access.member('requirements:write'), async (req, res) => {
    const { organizationId } = requireMembership(req);
    const id = await createSpecies(db, organizationId, createSpeciesInput.parse(req.body));
    res.status(201).json(await getSpecies(db, organizationId, id));
  });

  router.post('/:id/phases', access.member('requirements:write'), async (req, res) => {
    const { organizationId } = requireMembership(req);
    const { id } = idParams.parse(req.params);
    await createPhase(db, organizationId, id, createPhaseInput.parse(req.body));
    res.status(201).json(await getSpecies(db, organizationId, id));
  });

  return router;
}
