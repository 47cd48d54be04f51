import { and, eq, isNull } from 'drizzle-orm';

import { approveVersion, archiveFormula, createFormula, keepVersion } from '../../../server/db/queries/formulas';
import { ingredients, specifications } from '../../../server/db/schema';
import { REFERENCE_LIBRARY_STEP, seedDemoData } from '../../../server/db/seed';
import { createFormulaInput } from '../../../src/shared/schemas/formulas';
import { allowOnly, type AuthWorld, type RuleSet } from './types';

const READERS = ['owner', 'nutritionist', 'advisor'] as const;
const SOLVERS = ['owner', 'nutritionist', 'advisor'] as const;
const APPROVERS = ['owner', 'nutritionist'] as const;
const APPROVED_READERS = ['owner', 'nutritionist', 'advisor', 'mill_operator'] as const;

async function fixtures(world: AuthWorld) {
  const db = world.db;
  await seedDemoData(db, [REFERENCE_LIBRARY_STEP]);
  const ref = async (code: string) => (await db.select().from(ingredients).where(and(isNull(ingredients.organizationId), eq(ingredients.code, code))))[0];
  const [spec] = await db.select().from(specifications).where(and(isNull(specifications.organizationId), eq(specifications.code, 'nrc1994-broiler-grower')));
  const [maize, soy, oil] = [await ref('maize'), await ref('soybean-meal-48'), await ref('soybean-oil')];
  // Reference ingredients carry no price: the formula enters them. A loose specification keeps every solve optimal.
  const body = {
    name: 'Rule-table grower',
    specificationId: spec.id,
    ingredients: [{ ingredientId: maize.id, pricePerKg: 0.23 }, { ingredientId: soy.id, pricePerKg: 0.5 }, { ingredientId: oil.id, pricePerKg: 1.1 }],
    nutrients: [{ nutrientId: 'cp', min: 16 }],
    ratios: [],
  };
  const formulaId = await createFormula(db, world.orgA.id, world.userIds.owner, createFormulaInput.parse(body));
  const newVersion = () => keepVersion(db, world.orgA.id, world.userIds.owner, formulaId, undefined, null);
  const versionId = await newVersion();
  const approvedId = await newVersion();
  await approveVersion(db, world.orgA.id, world.userIds.owner, formulaId, approvedId);
  // A fresh draft for each caller of a delete, so every caller meets a formula that can be removed.
  const newDraft = () => createFormula(db, world.orgA.id, world.userIds.owner, createFormulaInput.parse({ ...body, name: 'Rule-table draft' }));
  // Archiving and restoring change state: each caller meets a formula in use, or an archived one.
  const newArchived = async () => {
    const id = await newDraft();
    await archiveFormula(db, world.orgA.id, world.userIds.owner, id);
    return id;
  };
  return { body, formulaId, versionId, approvedId, newVersion, newDraft, newArchived, soyId: soy.id };
}

/**
 * The formula workspace. Owners, nutritionists and advisors read and solve; owners and nutritionists
 * approve; mill operators reach only the current approved versions. Removing a never-approved draft
 * needs 'formulas:solve' like creating one; archiving and restoring need 'formulas:approve', since they
 * take a formula out of (or back into) the mill's daily view. Another organization's formula answers 404.
 */
export const formulasRules: RuleSet = {
  area: 'formulas',
  cases: async (world) => {
    const f = await fixtures(world);
    const base = `/api/formulas/${f.formulaId}`;
    return [
      { method: 'GET', pattern: '/api/formulas', url: '/api/formulas', expect: allowOnly(READERS, 200, { outsider: 200 }) },
      { method: 'POST', pattern: '/api/formulas', url: '/api/formulas', body: f.body, expect: allowOnly(SOLVERS, 201, { outsider: 201 }) },
      { method: 'GET', pattern: '/api/formulas/choices', url: '/api/formulas/choices', expect: allowOnly(SOLVERS, 200, { outsider: 200 }) },
      { method: 'GET', pattern: '/api/formulas/approved', url: '/api/formulas/approved', expect: allowOnly(APPROVED_READERS, 200, { outsider: 200 }) },
      { method: 'GET', pattern: '/api/formulas/approved/:id', url: `/api/formulas/approved/${f.approvedId}`, expect: allowOnly(APPROVED_READERS, 200, { outsider: 404 }) },
      { method: 'GET', pattern: '/api/formulas/:id', url: base, expect: allowOnly(READERS, 200, { outsider: 404 }) },
      {
        method: 'PUT',
        pattern: '/api/formulas/:id',
        url: base,
        body: { inputs: { batchKg: 1000, ingredients: f.body.ingredients, nutrients: f.body.nutrients } },
        expect: allowOnly(SOLVERS, 200, { outsider: 404 }),
      },
      { method: 'POST', pattern: '/api/formulas/:id/solve', url: `${base}/solve`, body: {}, expect: allowOnly(SOLVERS, 200, { outsider: 404 }) },
      { method: 'POST', pattern: '/api/formulas/:id/price-sweep', url: `${base}/price-sweep`, body: { ingredientId: f.soyId, steps: 3 }, expect: allowOnly(SOLVERS, 200, { outsider: 404 }) },
      { method: 'GET', pattern: '/api/formulas/:id/versions', url: `${base}/versions`, expect: allowOnly(READERS, 200, { outsider: 404 }) },
      { method: 'POST', pattern: '/api/formulas/:id/versions', url: `${base}/versions`, body: { note: 'Rule table' }, expect: allowOnly(SOLVERS, 201, { outsider: 404 }) },
      { method: 'GET', pattern: '/api/formulas/:id/versions/:versionId', url: `${base}/versions/${f.versionId}`, expect: allowOnly(READERS, 200, { outsider: 404 }) },
      {
        method: 'POST',
        pattern: '/api/formulas/:id/versions/:versionId/approve',
        url: `${base}/versions/0/approve`,
        prepare: async () => ({ url: `${base}/versions/${await f.newVersion()}/approve` }),
        expect: allowOnly(APPROVERS, 200, { outsider: 404 }),
      },
      { method: 'GET', pattern: '/api/formulas/:id/removal', url: `${base}/removal`, expect: allowOnly(SOLVERS, 200, { outsider: 404 }) },
      {
        method: 'DELETE',
        pattern: '/api/formulas/:id',
        url: '/api/formulas/0',
        prepare: async () => ({ url: `/api/formulas/${await f.newDraft()}` }),
        expect: allowOnly(SOLVERS, 204, { outsider: 404 }),
      },
      {
        method: 'POST',
        pattern: '/api/formulas/:id/archive',
        url: '/api/formulas/0/archive',
        prepare: async () => ({ url: `/api/formulas/${await f.newDraft()}/archive` }),
        expect: allowOnly(APPROVERS, 200, { outsider: 404 }),
      },
      {
        method: 'POST',
        pattern: '/api/formulas/:id/restore',
        url: '/api/formulas/0/restore',
        prepare: async () => ({ url: `/api/formulas/${await f.newArchived()}/restore` }),
        expect: allowOnly(APPROVERS, 200, { outsider: 404 }),
      },
      { method: 'GET', pattern: '/api/formulas/:id/compare', url: `${base}/compare?a=${f.versionId}&b=${f.approvedId}`, expect: allowOnly(READERS, 200, { outsider: 404 }) },
    ];
  },
};
