import { Router } from 'express';

import { idParams } from '../../src/shared/schemas/library-common';
import { copySpecificationInput, createSpecificationInput, listSpecificationsQuery, updateSpecificationInput } from '../../src/shared/schemas/specifications';
import type { Db } from '../db/client';
import { copySpecification, createSpecification, deleteSpecification, getSpecification, listSpecifications, updateSpecification } from '../db/queries/specifications';
import { access, requireMembership } from '../http/access';

/** Requirement specifications: reference ones (read and copy) and the organization's own (read and write). */
export function specificationsRouter({ db }: { db: Db }): Router {
  const router = Router();

  router.get('/', access.member('requirements:read'), async (req, res) => {
    const { organizationId } = requireMembership(req);
    res.json(await listSpecifications(db, organizationId, listSpecificationsQuery.parse(req.query)));
  });

  router.get('/:id', access.member('requirements:read'), async (req, res) => {
    const { organizationId } = requireMembership(req);
    res.json(await getSpecification(db, organizationId, idParams.parse(req.params).id));
  });

  router.post('/', access.member('requirements:write'), async (req, res) => {
    const { organizationId } = requireMembership(req);
    const id = await createSpecification(db, organizationId, createSpecificationInput.parse(req.body));
    res.status(201).json(await getSpecification(db, organizationId, id));
  });

  router.put('/:id', access.member('requirements:write'), async (req, res) => {
    const { organizationId } = requireMembership(req);
    const { id } = idParams.parse(req.params);
    await updateSpecification(db, organizationId, id, updateSpecificationInput.parse(req.body));
    res.json(await getSpecification(db, organizationId, id));
  });

  router.delete('/:id', access.member('requirements:write'), async (req, res) => {
    const { organizationId } = requireMembership(req);
    await deleteSpecification(db, organizationId, idParams.parse(req.params).id);
    res.status(204).end();
  });

  router.post('/:id/copy', access.member('requirements:write'), async (req, res) => {
    const { organizationId } = requireMembership(req);
    const { id } = idParams.parse(req.params);
    const newId = await copySpecification(db, organizationId, id, copySpecificationInput.parse(req.body ?? {}));
    res.status(201).json(await getSpecification(db, organizationId, newId));
  });

  return router;
}
