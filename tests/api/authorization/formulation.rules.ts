import { allowOnly, type RuleSet } from './types';

// A two-feed crude-protein problem: small, valid, and the same for every caller.
const ingredients = [
  { id: 'corn', pricePerKg: 0.1, nutrients: { cp: 8.9 } },
  { id: 'soybean-meal', pricePerKg: 0.2, nutrients: { cp: 44.4 } },
];
const nutrients = [{ id: 'cp', min: 18, max: 18 }];
const problem = { batchKg: 1000, ingredients, nutrients };

const SOLVERS = ['owner', 'nutritionist', 'advisor'] as const;

/** The formulation engine over HTTP: solving needs formulas:solve; checking a ration needs ration:check. */
export const formulationRules: RuleSet = {
  area: 'formulation',
  cases: async () => [
    { method: 'POST', pattern: '/api/solve', url: '/api/solve', body: problem, expect: allowOnly(SOLVERS, 200, { outsider: 200 }) },
    {
      method: 'POST',
      pattern: '/api/solve/evaluate',
      url: '/api/solve/evaluate',
      body: { batchKg: 1000, ingredients, nutrients, mix: [{ id: 'corn', percent: 75 }, { id: 'soybean-meal', percent: 25 }] },
      expect: allowOnly(['owner', 'nutritionist', 'advisor', 'farm_member'], 200, { outsider: 200 }),
    },
    {
      method: 'POST',
      pattern: '/api/solve/allocate',
      url: '/api/solve/allocate',
      body: { ingredients, formulas: [{ id: 'grower', name: 'Grower', batchKg: 1000, nutrients }] },
      expect: allowOnly(SOLVERS, 200, { outsider: 200 }),
    },
    {
      method: 'POST',
      pattern: '/api/solve/price-sweep',
      url: '/api/solve/price-sweep',
      body: { problem, ingredient: 'soybean-meal', fromPrice: 0.1, toPrice: 0.4, steps: 4 },
      expect: allowOnly(SOLVERS, 200, { outsider: 200 }),
    },
  ],
};
