import { randomBytes } from 'node:crypto';
import { and, eq, isNull } from 'drizzle-orm';

import { approveVersion, createFormula, getVersion, keepVersion } from '../../../server/db/queries/formulas';
import { ingredients, memberships, shares, specifications } from '../../../server/db/schema';
import { REFERENCE_LIBRARY_STEP, seedDemoData } from '../../../server/db/seed';
import { createFormulaInput } from '../../../src/shared/schemas/formulas';
import { createOrganization, createUser } from '../../helpers/accounts';
import { allowOnly, type AuthWorld, type RuleSet } from './types';

const EVERYONE = ['owner', 'nutritionist', 'mill_operator', 'advisor', 'farm_member'] as const;
const APPROVED_READERS = ['owner', 'nutritionist', 'advisor', 'mill_operator'] as const;
const RECORDERS = ['owner', 'mill_operator'] as const;
const CHECKERS = ['owner', 'nutritionist', 'advisor', 'farm_member'] as const;
const SHARERS = ['owner', 'nutritionist', 'advisor'] as const;

async function fixtures(world: AuthWorld) {
  const db = world.db;
  await seedDemoData(db, [REFERENCE_LIBRARY_STEP]);
  const ref = async (code: string) => (await db.select().from(ingredients).where(and(isNull(ingredients.organizationId), eq(ingredients.code, code))))[0];
  const [spec] = await db.select().from(specifications).where(and(isNull(specifications.organizationId), eq(specifications.code, 'nrc1994-broiler-starter')));
  const [maize, soy] = [await ref('maize'), await ref('soybean-meal-48')];
  const body = { name: 'Outputs rule-table formula', specificationId: spec.id, ingredients: [{ ingredientId: maize.id, pricePerKg: 0.23 }, { ingredientId: soy.id, pricePerKg: 0.5 }], nutrients: [{ nutrientId: 'cp', min: 14 }], ratios: [] };
  const formulaId = await createFormula(db, world.orgA.id, world.userIds.owner, createFormulaInput.parse(body));
  const versionId = await keepVersion(db, world.orgA.id, world.userIds.owner, formulaId, undefined, null);
  await approveVersion(db, world.orgA.id, world.userIds.owner, formulaId, versionId);
  // A farm the sharers of A also belong to (joined after A, so A stays their first organization), with a member to mail.
  const farm = await createOrganization(db, 'Organization C Farm', 'farm');
  await createUser(db, { email: 'farmer@c.example.org', organizationId: farm.id, role: 'owner' });
  for (const role of SHARERS) await db.insert(memberships).values({ userId: world.userIds[role], organizationId: farm.id, role: 'advisor' });
  // Something already shared with A, to read.
  const version = await getVersion(db, world.orgA.id, formulaId, versionId);
  const token = randomBytes(18).toString('base64url');
  const { snapshot, ...summary } = version;
  await db.insert(shares).values({
    token, fromOrganizationId: world.orgB.id, toOrganizationId: world.orgA.id, kind: 'formula_version', title: 'Rule-table share',
    payload: { kind: 'formula_version', formulaName: snapshot.formulaName, version: summary, snapshot, measures: { unitSystem: 'metric', currency: 'EUR' } },
    sharedByName: 'Rule table', recipients: [],
  });
  const check = { specificationId: spec.id, lines: [{ name: 'Home-grown maize', kg: 700, pricePerKg: 0.2, values: { lys: 0.26 } }, { ingredientId: soy.id, kg: 300, pricePerKg: 0.5 }] };
  return { formulaId, versionId, farmId: farm.id, token, check };
}

/**
 * Batch sheets, the batch log, ration checks, shares and organization settings. Another organization's
 * version or share answers 404; lists and settings answer the caller's own organization.
 */
export const outputsRules: RuleSet = {
  area: 'outputs',
  cases: async (world) => {
    const f = await fixtures(world);
    return [
      { method: 'GET', pattern: '/api/organization-settings', url: '/api/organization-settings', expect: allowOnly(EVERYONE, 200, { outsider: 200 }) },
      { method: 'PUT', pattern: '/api/organization-settings', url: '/api/organization-settings', body: { unitSystem: 'metric', currency: 'EUR' }, expect: allowOnly(['owner'], 200, { outsider: 200 }) },
      { method: 'GET', pattern: '/api/batch-sheets/:versionId', url: `/api/batch-sheets/${f.versionId}?batchSize=500`, expect: allowOnly(APPROVED_READERS, 200, { outsider: 404 }) },
      { method: 'GET', pattern: '/api/batch-sheets/:versionId/csv', url: `/api/batch-sheets/${f.versionId}/csv`, expect: allowOnly(APPROVED_READERS, 200, { outsider: 404 }) },
      { method: 'GET', pattern: '/api/batches', url: '/api/batches', expect: allowOnly(APPROVED_READERS, 200, { outsider: 200 }) },
      {
        method: 'POST', pattern: '/api/batches', url: '/api/batches',
        body: { versionId: f.versionId, madeOn: '2026-03-02', batchSize: 1000, operatorName: 'RT' },
        expect: allowOnly(RECORDERS, 201, { outsider: 404 }),
      },
      { method: 'GET', pattern: '/api/ration-checks/choices', url: '/api/ration-checks/choices', expect: allowOnly(CHECKERS, 200, { outsider: 200 }) },
      { method: 'POST', pattern: '/api/ration-checks', url: '/api/ration-checks', body: f.check, expect: allowOnly(CHECKERS, 200, { outsider: 200 }) },
      { method: 'GET', pattern: '/api/shares/targets', url: '/api/shares/targets', expect: allowOnly(SHARERS, 200, { outsider: 200 }) },
      {
        method: 'POST', pattern: '/api/shares', url: '/api/shares',
        body: { kind: 'formula_version', formulaId: f.formulaId, versionId: f.versionId, toOrganizationId: f.farmId },
        expect: allowOnly(SHARERS, 201, { outsider: 404 }),
      },
      { method: 'GET', pattern: '/api/shares', url: '/api/shares', expect: allowOnly(EVERYONE, 200, { outsider: 200 }) },
      { method: 'GET', pattern: '/api/shares/:token', url: `/api/shares/${f.token}`, expect: allowOnly(EVERYONE, 200, { outsider: 404 }) },
      { method: 'GET', pattern: '/api/shares/:token/csv', url: `/api/shares/${f.token}/csv`, expect: allowOnly(EVERYONE, 200, { outsider: 404 }) },
    ];
  },
};
