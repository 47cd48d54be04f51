import { Router } from 'express';

import { commitLabImportInput, labMappingQuery, previewLabImportInput } from '../../src/shared/schemas/lab-imports';
import { idParams } from '../../src/shared/schemas/library-common';
import type { Db } from '../db/client';
import { commitLabImport, getLabImportFile, getLabMapping, listIngredientAnalyses, listLabImports, listTargetIngredients, previewLabImport } from '../db/queries/lab-imports';
import { access, requireMembership } from '../http/access';

/**
 * Lab analysis files: preview (reads, writes nothing), save (one transaction), the history of imports
 * with their raw files, the mapping remembered per lab, and the analyses of one ingredient side by side.
 */
export function labImportsRouter({ db }: { db: Db }): Router {
  const router = Router();

  router.post('/lab-imports/preview', access.member('lab:import'), async (req, res) => {
    const { organizationId } = requireMembership(req);
    res.json(await previewLabImport(db, organizationId, previewLabImportInput.parse(req.body)));
  });

  router.post('/lab-imports', access.member('lab:import'), async (req, res) => {
    const { organizationId, userId } = requireMembership(req);
    res.status(201).json(await commitLabImport(db, organizationId, userId, commitLabImportInput.parse(req.body)));
  });

  router.get('/lab-imports', access.member('lab:import'), async (req, res) => {
    const { organizationId } = requireMembership(req);
    res.json({ items: await listLabImports(db, organizationId) });
  });

  router.get('/lab-imports/ingredients', access.member('lab:import'), async (req, res) => {
    const { organizationId } = requireMembership(req);
    res.json({ items: await listTargetIngredients(db, organizationId) });
  });

  router.get('/lab-imports/ingredients/:id/analyses', access.member('library:read'), async (req, res) => {
    const { organizationId } = requireMembership(req);
    res.json(await listIngredientAnalyses(db, organizationId, idParams.parse(req.params).id));
  });

  router.get('/lab-imports/:id/file', access.member('lab:import'), async (req, res) => {
    const { organizationId } = requireMembership(req);
    const file = await getLabImportFile(db, organizationId, idParams.parse(req.params).id);
    // The original bytes as text; served as a download, never rendered.
    res.attachment(file.fileName).type('text/csv; charset=utf-8').send(file.rawText);
  });

  router.get('/lab-mappings', access.member('lab:import'), async (req, res) => {
    const { organizationId } = requireMembership(req);
    const { lab } = labMappingQuery.parse(req.query);
    res.json({ lab, mapping: await getLabMapping(db, organizationId, lab) });
  });

  return router;
}
