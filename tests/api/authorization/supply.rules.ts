import { and, eq, isNull } from 'drizzle-orm';

import { createSupplyPlan } from '../../../server/db/queries/supply-plans';
import { ingredients, specifications } from '../../../server/db/schema';
import { REFERENCE_LIBRARY_STEP, seedDemoData } from '../../../server/db/seed';
import { createSupplyPlanInput } from '../../../src/shared/schemas/supply';
import { allowOnly, type AuthWorld, type RuleSet } from './types';

const READERS = ['owner', 'nutritionist', 'advisor', 'farm_member'] as const;
const WRITERS = ['owner', 'nutritionist'] as const;
const SOLVERS = ['owner', 'nutritionist', 'advisor'] as const;

const planBody = {
  name: 'Rule-table plan',
  streams: [{ name: 'Brewery grains', substrate: 'brewery_grains', tonnesPerWeek: 2 }],
};

async function fixtures(world: AuthWorld) {
  const db = world.db;
  await seedDemoData(db, [REFERENCE_LIBRARY_STEP]);
  const ref = async (code: string) => (await db.select().from(ingredients).where(and(isNull(ingredients.organizationId), eq(ingredients.code, code))))[0];
  const [spec] = await db.select().from(specifications).where(and(isNull(specifications.organizationId), eq(specifications.code, 'nrc1994-broiler-grower')));
  const newPlan = () => createSupplyPlan(db, world.orgA.id, world.userIds.owner, createSupplyPlanInput.parse(planBody));
  const planId = await newPlan();
  const allocateBody = {
    formulas: [{ specificationId: spec.id, tonnesPerWeek: 10 }],
    ingredients: [
      { ingredientId: (await ref('maize')).id, pricePerKg: 0.23 },
      { ingredientId: (await ref('soybean-meal-48')).id, pricePerKg: 0.5 },
    ],
    mealPricePerKg: 1.2,
  };
  return { planId, newPlan, allocateBody };
}

/** Insect supply plans: owners, nutritionists, advisors and farm members read; owners and nutritionists edit; solvers allocate. */
export const supplyRules: RuleSet = {
  area: 'supply',
  cases: async (world) => {
    const f = await fixtures(world);
    const base = `/api/supply-plans/${f.planId}`;
    return [
      { method: 'GET', pattern: '/api/supply-plans', url: '/api/supply-plans', expect: allowOnly(READERS, 200, { outsider: 200 }) },
      { method: 'POST', pattern: '/api/supply-plans', url: '/api/supply-plans', body: planBody, expect: allowOnly(WRITERS, 201, { outsider: 201 }) },
      { method: 'GET', pattern: '/api/supply-plans/allocation-options', url: '/api/supply-plans/allocation-options', expect: allowOnly(SOLVERS, 200, { outsider: 200 }) },
      { method: 'GET', pattern: '/api/supply-plans/:id', url: base, expect: allowOnly(READERS, 200, { outsider: 404 }) },
      { method: 'PUT', pattern: '/api/supply-plans/:id', url: base, body: planBody, expect: allowOnly(WRITERS, 200, { outsider: 404 }) },
      {
        method: 'DELETE',
        pattern: '/api/supply-plans/:id',
        url: base,
        prepare: async () => ({ url: `/api/supply-plans/${await f.newPlan()}` }),
        expect: allowOnly(WRITERS, 204, { outsider: 404 }),
      },
      { method: 'POST', pattern: '/api/supply-plans/:id/allocate', url: `${base}/allocate`, body: f.allocateBody, expect: allowOnly(SOLVERS, 200, { outsider: 404 }) },
    ];
  },
};
