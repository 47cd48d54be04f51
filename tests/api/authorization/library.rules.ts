import { and, eq, isNull } from 'drizzle-orm';

import { createIngredient } from '../../../server/db/queries/ingredients';
import { createSpecies } from '../../../server/db/queries/species';
import { createSpecification } from '../../../server/db/queries/specifications';
import { ingredients, species, specifications } from '../../../server/db/schema';
import { REFERENCE_LIBRARY_STEP, seedDemoData } from '../../../server/db/seed';
import { createIngredientInput } from '../../../src/shared/schemas/ingredients';
import { createSpecificationInput } from '../../../src/shared/schemas/specifications';
import { allowOnly, type AuthWorld, type RuleSet } from './types';

const EVERYONE = ['owner', 'nutritionist', 'mill_operator', 'advisor', 'farm_member'] as const;
const WRITERS = ['owner', 'nutritionist'] as const;
const LAB = ['owner', 'nutritionist', 'advisor'] as const;

const ingredientBody = { name: 'Rule-table barley', category: 'cereal_grain', values: { cp: 11 }, source: { kind: 'estimate', name: 'Test row', dryMatterPct: 88 } };

async function fixtures(world: AuthWorld) {
  const db = world.db;
  await seedDemoData(db, [REFERENCE_LIBRARY_STEP]);
  const [reference] = await db.select().from(ingredients).where(and(isNull(ingredients.organizationId), eq(ingredients.code, 'maize')));
  const [broiler] = await db.select().from(species).where(and(isNull(species.organizationId), eq(species.code, 'broiler')));
  const [refSpec] = await db.select().from(specifications).where(and(isNull(specifications.organizationId), eq(specifications.code, 'nrc1994-broiler-starter')));
  const newIngredient = () => createIngredient(db, world.orgA.id, world.userIds.owner, createIngredientInput.parse(ingredientBody));
  const specBody = { speciesId: broiler.id, name: 'Rule-table starter', source: 'Test row', bounds: [{ nutrientId: 'cp', min: 22 }] };
  const newSpecification = () => createSpecification(db, world.orgA.id, createSpecificationInput.parse(specBody));
  const ownSpecies = await createSpecies(db, world.orgA.id, { name: 'Rule-table turkey', family: 'poultry' });
  return { reference, broiler, refSpec, ownIngredient: await newIngredient(), ownSpec: await newSpecification(), ownSpecies, newIngredient, newSpecification, specBody };
}

/**
 * The nutrient library and requirements. Everyone in an organization reads; owners and nutritionists
 * write; lab analyses also by advisors. Rows of organization A answer 404 to the outsider, while the
 * reference library is readable (and copyable) by every member of any organization.
 */
export const libraryRules: RuleSet = {
  area: 'library',
  cases: async (world) => {
    const f = await fixtures(world);
    return [
      { method: 'GET', pattern: '/api/nutrients', url: '/api/nutrients', expect: allowOnly(EVERYONE, 200, { outsider: 200 }) },
      { method: 'GET', pattern: '/api/ingredients', url: '/api/ingredients?search=barley', expect: allowOnly(EVERYONE, 200, { outsider: 200 }) },
      { method: 'GET', pattern: '/api/ingredients/:id', url: `/api/ingredients/${f.ownIngredient}`, expect: allowOnly(EVERYONE, 200, { outsider: 404 }) },
      { method: 'POST', pattern: '/api/ingredients', url: '/api/ingredients', body: ingredientBody, expect: allowOnly(WRITERS, 201, { outsider: 201 }) },
      { method: 'PATCH', pattern: '/api/ingredients/:id', url: `/api/ingredients/${f.ownIngredient}`, body: { notes: 'Checked' }, expect: allowOnly(WRITERS, 200, { outsider: 404 }) },
      {
        method: 'DELETE',
        pattern: '/api/ingredients/:id',
        url: '/api/ingredients/0',
        prepare: async () => ({ url: `/api/ingredients/${await f.newIngredient()}` }),
        expect: allowOnly(WRITERS, 204, { outsider: 404 }),
      },
      { method: 'POST', pattern: '/api/ingredients/copy-reference', url: '/api/ingredients/copy-reference', body: {}, expect: allowOnly(WRITERS, 201, { outsider: 201 }) },
      { method: 'POST', pattern: '/api/ingredients/:id/copy', url: `/api/ingredients/${f.reference.id}/copy`, body: {}, expect: allowOnly(WRITERS, 201, { outsider: 201 }) },
      {
        method: 'POST',
        pattern: '/api/ingredients/:id/lab-analyses',
        url: `/api/ingredients/${f.ownIngredient}/lab-analyses`,
        body: { laboratory: 'Rule-table lab', analysedOn: '2026-03-01', dryMatterPct: 88.5, values: { cp: 11.4 } },
        expect: allowOnly(LAB, 201, { outsider: 404 }),
      },
      { method: 'GET', pattern: '/api/prices', url: `/api/prices?ingredientId=${f.ownIngredient}`, expect: allowOnly(EVERYONE, 200, { outsider: 404 }) },
      {
        method: 'POST',
        pattern: '/api/prices',
        url: '/api/prices',
        body: { effectiveOn: '2026-03-23', items: [{ ingredientId: f.ownIngredient, pricePerKg: 0.21 }] },
        expect: allowOnly(WRITERS, 201, { outsider: 404 }),
      },
      { method: 'GET', pattern: '/api/species', url: '/api/species', expect: allowOnly(EVERYONE, 200, { outsider: 200 }) },
      { method: 'GET', pattern: '/api/species/:id', url: `/api/species/${f.ownSpecies}`, expect: allowOnly(EVERYONE, 200, { outsider: 404 }) },
      // Names must be new in the organization's list, so each caller adds its own.
      { method: 'POST', pattern: '/api/species', url: '/api/species', body: { name: 'Quail', family: 'poultry' }, prepare: async (caller) => ({ body: { name: `Quail ${caller}`, family: 'poultry' } }), expect: allowOnly(WRITERS, 201, { outsider: 201 }) },
      { method: 'POST', pattern: '/api/species/:id/phases', url: `/api/species/${f.ownSpecies}/phases`, body: { name: 'Brooding', span: '0–4 weeks' }, prepare: async (caller) => ({ body: { name: `Brooding ${caller}`, span: '0–4 weeks' } }), expect: allowOnly(WRITERS, 201, { outsider: 404 }) },
      { method: 'GET', pattern: '/api/specifications', url: '/api/specifications?library=reference', expect: allowOnly(EVERYONE, 200, { outsider: 200 }) },
      { method: 'GET', pattern: '/api/specifications/:id', url: `/api/specifications/${f.ownSpec}`, expect: allowOnly(EVERYONE, 200, { outsider: 404 }) },
      { method: 'POST', pattern: '/api/specifications', url: '/api/specifications', body: f.specBody, expect: allowOnly(WRITERS, 201, { outsider: 201 }) },
      { method: 'PUT', pattern: '/api/specifications/:id', url: `/api/specifications/${f.ownSpec}`, body: f.specBody, expect: allowOnly(WRITERS, 200, { outsider: 404 }) },
      {
        method: 'DELETE',
        pattern: '/api/specifications/:id',
        url: '/api/specifications/0',
        prepare: async () => ({ url: `/api/specifications/${await f.newSpecification()}` }),
        expect: allowOnly(WRITERS, 204, { outsider: 404 }),
      },
      { method: 'POST', pattern: '/api/specifications/:id/copy', url: `/api/specifications/${f.refSpec.id}/copy`, body: {}, expect: allowOnly(WRITERS, 201, { outsider: 201 }) },
    ];
  },
};
