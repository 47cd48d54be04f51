import { Router } from 'express';

import { idParams } from '../../src/shared/schemas/library-common';
import { choicesQuery, compareQuery, createFormulaInput, formulaPriceSweepInput, keepVersionInput, listFormulasQuery, solveFormulaInput, updateFormulaInput, versionParams } from '../../src/shared/schemas/formulas';
import type { Db } from '../db/client';
import {
  approveVersion,
  archiveFormula,
  compareVersions,
  createFormula,
  deleteFormula,
  formulaChoices,
  formulaRemoval,
  getApprovedVersion,
  getFormula,
  getVersion,
  keepVersion,
  listApproved,
  listFormulas,
  listVersions,
  restoreFormula,
  solveFormulaInputs,
  sweepIngredientPrice,
  updateFormula,
} from '../db/queries/formulas';
import { access, requireMembership } from '../http/access';

const approvedParams = idParams;

/**
 * The formula workspace. Planners (formulas:read / formulas:solve) see and solve everything; approving
 * needs formulas:approve. Mill operators hold only formulas:read-approved and reach only /approved: the
 * current approved version of each formula, never drafts or other versions. A formula never approved,
 * with nothing recorded against it, can be deleted; any other is refused with what holds it, and can
 * be archived instead: out of the working list and the mill's approved list, read-only, restorable.
 */
export function formulasRouter({ db }: { db: Db }): Router {
  const router = Router();

  router.get('/approved', access.member('formulas:read-approved'), async (req, res) => {
    const { organizationId } = requireMembership(req);
    res.json(await listApproved(db, organizationId));
  });

  router.get('/approved/:id', access.member('formulas:read-approved'), async (req, res) => {
    const { organizationId } = requireMembership(req);
    res.json(await getApprovedVersion(db, organizationId, approvedParams.parse(req.params).id));
  });

  router.get('/choices', access.member('formulas:solve'), async (req, res) => {
    const { organizationId } = requireMembership(req);
    res.json(await formulaChoices(db, organizationId, choicesQuery.parse(req.query).specificationId));
  });

  router.get('/', access.member('formulas:read'), async (req, res) => {
    const { organizationId } = requireMembership(req);
    res.json(await listFormulas(db, organizationId, listFormulasQuery.parse(req.query).archived));
  });

  router.post('/', access.member('formulas:solve'), async (req, res) => {
    const { organizationId, userId } = requireMembership(req);
    const id = await createFormula(db, organizationId, userId, createFormulaInput.parse(req.body));
    res.status(201).json(await getFormula(db, organizationId, id));
  });

  router.get('/:id', access.member('formulas:read'), async (req, res) => {
    const { organizationId } = requireMembership(req);
    res.json(await getFormula(db, organizationId, idParams.parse(req.params).id));
  });

  router.put('/:id', access.member('formulas:solve'), async (req, res) => {
    const { organizationId } = requireMembership(req);
    const { id } = idParams.parse(req.params);
    await updateFormula(db, organizationId, id, updateFormulaInput.parse(req.body));
    res.json(await getFormula(db, organizationId, id));
  });

  // Removing is open to whoever may create and solve formulas ('formulas:solve'): only a formula nobody
  // approved and nothing was recorded against is ever deleted, and that is a planner's own draft work.
  // Anything approved, recorded or shared is refused for every role, so no approval right is needed
  // here; archiving such a formula would withdraw it from the mill and need 'formulas:approve'.
  router.get('/:id/removal', access.member('formulas:solve'), async (req, res) => {
    const { organizationId } = requireMembership(req);
    res.json(await formulaRemoval(db, organizationId, idParams.parse(req.params).id));
  });

  router.delete('/:id', access.member('formulas:solve'), async (req, res) => {
    const { organizationId } = requireMembership(req);
    await deleteFormula(db, organizationId, idParams.parse(req.params).id);
    res.status(204).end();
  });

  // Archiving takes a formula, approved version included, out of the mill's daily view: what the mill
  // makes is a nutritionist's or owner's decision, so it needs 'formulas:approve' (like approving),
  // and so does bringing it back. An archived formula is read-only until restored.
  router.post('/:id/archive', access.member('formulas:approve'), async (req, res) => {
    const { organizationId, userId } = requireMembership(req);
    const { id } = idParams.parse(req.params);
    await archiveFormula(db, organizationId, userId, id);
    res.json(await getFormula(db, organizationId, id));
  });

  router.post('/:id/restore', access.member('formulas:approve'), async (req, res) => {
    const { organizationId } = requireMembership(req);
    const { id } = idParams.parse(req.params);
    await restoreFormula(db, organizationId, id);
    res.json(await getFormula(db, organizationId, id));
  });

  router.post('/:id/solve', access.member('formulas:solve'), async (req, res) => {
    const { organizationId } = requireMembership(req);
    const { id } = idParams.parse(req.params);
    res.json(await solveFormulaInputs(db, organizationId, id, solveFormulaInput.parse(req.body ?? {}).inputs));
  });

  router.post('/:id/price-sweep', access.member('formulas:solve'), async (req, res) => {
    const { organizationId } = requireMembership(req);
    const { id } = idParams.parse(req.params);
    res.json(await sweepIngredientPrice(db, organizationId, id, formulaPriceSweepInput.parse(req.body)));
  });

  router.get('/:id/versions', access.member('formulas:read'), async (req, res) => {
    const { organizationId } = requireMembership(req);
    res.json(await listVersions(db, organizationId, idParams.parse(req.params).id));
  });

  router.post('/:id/versions', access.member('formulas:solve'), async (req, res) => {
    const { organizationId, userId } = requireMembership(req);
    const { id } = idParams.parse(req.params);
    const input = keepVersionInput.parse(req.body ?? {});
    const versionId = await keepVersion(db, organizationId, userId, id, input.inputs, input.note);
    res.status(201).json(await getVersion(db, organizationId, id, versionId));
  });

  router.get('/:id/versions/:versionId', access.member('formulas:read'), async (req, res) => {
    const { organizationId } = requireMembership(req);
    const { id, versionId } = versionParams.parse(req.params);
    res.json(await getVersion(db, organizationId, id, versionId));
  });

  router.post('/:id/versions/:versionId/approve', access.member('formulas:approve'), async (req, res) => {
    const { organizationId, userId } = requireMembership(req);
    const { id, versionId } = versionParams.parse(req.params);
    await approveVersion(db, organizationId, userId, id, versionId);
    res.json(await getVersion(db, organizationId, id, versionId));
  });

  router.get('/:id/compare', access.member('formulas:read'), async (req, res) => {
    const { organizationId } = requireMembership(req);
    const { id } = idParams.parse(req.params);
    const { a, b } = compareQuery.parse(req.query);
    res.json(await compareVersions(db, organizationId, id, a, b));
  });

  return router;
}
