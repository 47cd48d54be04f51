import { createIngredient } from '../../../server/db/queries/ingredients';
import { commitLabImport } from '../../../server/db/queries/lab-imports';
import { REFERENCE_LIBRARY_STEP, seedDemoData } from '../../../server/db/seed';
import { createIngredientInput } from '../../../src/shared/schemas/ingredients';
import { commitLabImportInput } from '../../../src/shared/schemas/lab-imports';
import { allowOnly, type RuleSet } from './types';

const EVERYONE = ['owner', 'nutritionist', 'mill_operator', 'advisor', 'farm_member'] as const;
const LAB = ['owner', 'nutritionist', 'advisor'] as const;

const FILE = 'Sample,Dry matter %,Crude protein %,Ash %\nRT-1,90.5,47.2,7.0\n';
const read = { fileName: 'rule-table.csv', text: FILE, labName: 'Rule-table lab', estimation: { classId: 'soybean_meal' } };
const commitBody = { ...read, analysedOn: '2026-03-12', samples: [{ sampleId: 'RT-1', target: { kind: 'new', name: 'Rule-table soybean meal', category: 'oilseed_meal' } }] };

/**
 * Lab imports: owners, nutritionists and advisors read and save files; everyone in the organization may
 * compare an ingredient's analyses (as they read the library). Organization A's rows answer 404 to the outsider.
 */
export const labImportsRules: RuleSet = {
  area: 'lab-imports',
  cases: async (world) => {
    await seedDemoData(world.db, [REFERENCE_LIBRARY_STEP]);
    const ingredientId = await createIngredient(world.db, world.orgA.id, world.userIds.owner, createIngredientInput.parse({ name: 'Rule-table larvae meal', category: 'oilseed_meal', values: { cp: 40 }, source: { kind: 'estimate', name: 'Test row', dryMatterPct: 92 } }));
    const saved = await commitLabImport(world.db, world.orgA.id, world.userIds.owner, commitLabImportInput.parse({ ...commitBody, samples: [{ sampleId: 'RT-1', target: { kind: 'existing', ingredientId } }] }));
    return [
      { method: 'POST', pattern: '/api/lab-imports/preview', url: '/api/lab-imports/preview', body: read, expect: allowOnly(LAB, 200, { outsider: 200 }) },
      { method: 'POST', pattern: '/api/lab-imports', url: '/api/lab-imports', body: commitBody, expect: allowOnly(LAB, 201, { outsider: 201 }) },
      { method: 'GET', pattern: '/api/lab-imports', url: '/api/lab-imports', expect: allowOnly(LAB, 200, { outsider: 200 }) },
      { method: 'GET', pattern: '/api/lab-imports/ingredients', url: '/api/lab-imports/ingredients', expect: allowOnly(LAB, 200, { outsider: 200 }) },
      { method: 'GET', pattern: '/api/lab-imports/ingredients/:id/analyses', url: `/api/lab-imports/ingredients/${ingredientId}/analyses`, expect: allowOnly(EVERYONE, 200, { outsider: 404 }) },
      { method: 'GET', pattern: '/api/lab-imports/:id/file', url: `/api/lab-imports/${saved.id}/file`, expect: allowOnly(LAB, 200, { outsider: 404 }) },
      { method: 'GET', pattern: '/api/lab-mappings', url: '/api/lab-mappings?lab=Rule-table%20lab', expect: allowOnly(LAB, 200, { outsider: 200 }) },
    ];
  },
};
