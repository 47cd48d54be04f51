import assert from 'node:assert/strict';
import { describe, test } from 'node:test';

import { REFERENCE_SPECIFICATIONS } from '../../server/db/reference-data/requirements';
import { solveFormula } from '../../src/shared/engine';
import { buildFormulaProblem, capWarnings, compareSolves, groupId, inputsFromSpecification, type BuildContext, type LibraryIngredient, type SpecificationBounds } from '../../src/shared/formula-problem';
import type { FormulaInputs, FormulaSolve, NutrientInfo } from '../../src/shared/schemas/formulas';
import { formulaInputsSchema } from '../../src/shared/schemas/formulas';

const close = (actual: number, expected: number, tol: number, what: string) => assert.ok(Math.abs(actual - expected) <= tol, `${what}: ${actual} is not within ${tol} of ${expected}`);

// Test library. Mineral values are stoichiometry of the pure compounds ([D] in the domain reference,
// composition table): CaCO3 Ca 40.04 %, CaHPO4·2H2O Ca 23.29 % and P 18.00 %, NaCl Na 39.34 %.
// Maize, soybean meal and the larvae meal carry typical values recalled from memory: they are inputs
// here, never check values.
function ingredient(id: number, name: string, category: LibraryIngredient['category'], pricePerKg: number | null, values: Record<string, number>, insect?: Partial<LibraryIngredient>): LibraryIngredient {
  return { id, name, category, insectSpecies: null, substrate: null, substrateOrigin: null, substrateAnimals: null, pricePerKg, priceDate: '2026-03-16', version: 1, values, ...insect };
}
const MAIZE = ingredient(1, 'Maize', 'cereal_grain', 0.229, { cp: 8.5, lys: 0.26, met: 0.18, ca: 0.02, avp: 0.08, na: 0.02, amen_poultry: 3350 });
const SOY = ingredient(2, 'Soybean meal 48', 'oilseed_meal', 0.512, { cp: 47.5, lys: 2.96, met: 0.67, ca: 0.3, avp: 0.2, na: 0.02, amen_poultry: 2440 });
const LIMESTONE = ingredient(3, 'Limestone', 'mineral', 0.063, { ca: 40.04 });
const DCP = ingredient(4, 'Dicalcium phosphate', 'mineral', 0.72, { ca: 23.29, p: 18.0, avp: 18.0 });
const SALT = ingredient(5, 'Salt', 'mineral', 0.11, { na: 39.34 });
const BSF = ingredient(6, 'Black soldier fly larvae meal (brewery grains)', 'insect_meal', 0.4, { cp: 45.2, lys: 2.6, met: 0.8, ca: 1.7, avp: 0.4, na: 0.1, amen_poultry: 3300 }, {
  insectSpecies: 'hermetia_illucens', substrate: 'Brewery spent grains', substrateOrigin: 'plant', substrateAnimals: [],
});
const OFFAL_MEAL = ingredient(7, 'Larvae meal, defatted (poultry processing offal)', 'insect_meal', 1.52, { cp: 55.2, ca: 2.8 }, {
  insectSpecies: 'hermetia_illucens', substrate: 'Poultry processing offal', substrateOrigin: 'animal', substrateAnimals: ['chicken'],
});
const NO_PRICE = ingredient(8, 'Wheat bran', 'cereal_by_product', null, { cp: 15.5 });
const OIL = ingredient(9, 'Soybean oil', 'fat_and_oil', 1.14, { amen_poultry: 8950 });
const LIBRARY = new Map([MAIZE, SOY, LIMESTONE, DCP, SALT, BSF, OFFAL_MEAL, NO_PRICE, OIL].map((i) => [i.id, i]));

const NUTRIENTS = new Map<string, NutrientInfo>(
  [
    ['cp', 'Crude protein', '%'], ['lys', 'Lysine, total', '%'], ['met', 'Methionine, total', '%'], ['ca', 'Calcium', '%'], ['p', 'Phosphorus, total', '%'],
    ['avp', 'Available (non-phytate) P (poultry)', '%'], ['na', 'Sodium', '%'], ['amen_poultry', 'AMEn (poultry)', 'kcal/kg'],
  ].map(([id, name, unit]) => [id, { id, name, unit }]),
);
const BROILER = { name: 'Broiler chicken', family: 'poultry' as const };
const ctx = (over: Partial<BuildContext> = {}): BuildContext => ({ library: LIBRARY, nutrients: NUTRIENTS, species: BROILER, ...over });

const choose = (...ids: number[]) => ids.map((ingredientId) => ({ ingredientId }));

/** The reference broiler grower specification as the library stores it (caps as % of feed). */
function broilerGrowerSpec(): SpecificationBounds {
  const ref = REFERENCE_SPECIFICATIONS.find((s) => s.code === 'nrc1994-broiler-grower')!;
  return {
    bounds: ref.bounds.map((b) => ({ nutrientId: b.nutrientId, min: b.min ?? null, max: b.max ?? null })),
    ratios: (ref.ratios ?? []).map((r) => ({ numeratorId: r.numeratorId, denominatorId: r.denominatorId, min: r.min ?? null, max: r.max ?? null })),
    caps: (ref.caps ?? []).map((c) => ({ scope: c.scope, ingredientId: null, category: c.category ?? null, insectSpecies: c.insectSpecies ?? null, minPct: null, maxPct: c.maxPct, soft: true, source: c.source })),
  };
}

/** A small broiler grower problem on the test nutrients (bounds from NRC 1994, grower column). */
function growerInputs(over: Partial<FormulaInputs> = {}): FormulaInputs {
  return formulaInputsSchema.parse({
    batchKg: 1000,
    ingredients: choose(1, 2, 3, 4, 5, 6, 9),
    nutrients: [
      { nutrientId: 'amen_poultry', min: 3200 },
      { nutrientId: 'cp', min: 20 },
      { nutrientId: 'lys', min: 1.0 },
      { nutrientId: 'met', min: 0.38 },
      { nutrientId: 'ca', min: 0.9, max: 1.1 },
      { nutrientId: 'avp', min: 0.35 },
      { nutrientId: 'na', min: 0.15, max: 0.25 },
    ],
    groups: [{ label: 'Black soldier fly meals in all', scope: 'insect_species', insectSpecies: 'hermetia_illucens', maxPct: 10, testedMaxPct: 10, source: 'Dabbou et al. 2018' }],
    ...over,
  });
}

function solve(inputs: FormulaInputs, c = ctx()): FormulaSolve {
  const built = buildFormulaProblem(inputs, c);
  assert.ok(built.ok, built.ok ? '' : built.message);
  const result = solveFormula(built.problem);
  return { basis: 'as fed', specification: null, species: null, ingredients: built.used, nutrients: built.nutrients, problem: built.problem, result, capWarnings: capWarnings(inputs, result), solvedAt: '2026-03-16T00:00:00Z' };
}

describe('inputs from a specification', () => {
  test('the broiler grower specification fills the bounds of NRC (1994), grower column', () => {
    const inputs = inputsFromSpecification(broilerGrowerSpec(), choose(1, 2, 6), 2000);
    const min = (id: string) => inputs.nutrients.find((b) => b.nutrientId === id)?.min;
    // Check values: NRC (1994) broiler table, 3–6 weeks, as adapted in the Merck Veterinary Manual
    // "Nutrient Requirements of Broilers" (domain reference §1, rows tagged [V]).
    assert.equal(min('amen_poultry'), 3200);
    assert.equal(min('cp'), 20);
    assert.equal(min('lys'), 1.0);
    assert.equal(min('met'), 0.38);
    assert.equal(min('metcys'), 0.72);
    assert.equal(min('thr'), 0.74);
    assert.equal(min('trp'), 0.18);
    assert.equal(inputs.batchKg, 2000);
    assert.equal(inputs.ingredients.length, 3);
  });

  test('insect caps become groups whose tested level is kept, so going past it can warn', () => {
    const inputs = inputsFromSpecification(broilerGrowerSpec(), choose(6), 1000);
    const bsf = inputs.groups.find((g) => g.insectSpecies === 'hermetia_illucens')!;
    // Dabbou et al. 2018 (J. Anim. Sci. Biotechnol.): up to 10 % partially defatted meal tested in broilers.
    assert.equal(bsf.maxPct, 10);
    assert.equal(bsf.testedMaxPct, 10);
    assert.match(bsf.label, /Black soldier fly/);
  });

  test('a per-ingredient cap applies to that ingredient unless the planner set a limit', () => {
    const spec: SpecificationBounds = { bounds: [], ratios: [], caps: [{ scope: 'ingredient', ingredientId: 2, category: null, insectSpecies: null, minPct: null, maxPct: 30, soft: false, source: 'common practice' }] };
    const inputs = inputsFromSpecification(spec, [{ ingredientId: 2 }, { ingredientId: 1, maxPct: 70 }], 1000);
    assert.equal(inputs.ingredients[0].maxPct, 30);
    assert.equal(inputs.ingredients[1].maxPct, 70);
  });
});

describe('building the engine problem', () => {
  test('prices, inclusion limits, groups and ratios reach the engine in its own terms', () => {
    const inputs = growerInputs({
      ingredients: [{ ingredientId: 1, maxPct: 70 }, { ingredientId: 2, pricePerKg: 0.49 }, { ingredientId: 6, minPct: 1 }],
      ratios: [{ numeratorId: 'ca', denominatorId: 'avp', min: 2, max: 2.2 }],
    });
    const built = buildFormulaProblem(inputs, ctx());
    assert.ok(built.ok);
    const maize = built.problem.ingredients.find((i) => i.id === '1')!;
    assert.equal(maize.maxPercent, 70);
    assert.equal(maize.pricePerKg, 0.229);
    const soy = built.used.find((u) => u.ingredientId === 2)!;
    assert.equal(soy.pricePerKg, 0.49);
    assert.equal(soy.priceSource, 'entered');
    assert.equal(soy.libraryPricePerKg, 0.512);
    assert.equal(built.problem.ingredients.find((i) => i.id === '6')!.minPercent, 1);
    assert.deepEqual(built.problem.groups?.[0], { id: groupId(0), name: 'Black soldier fly meals in all', members: ['6'], maxPercent: 10 });
    assert.equal(built.problem.ratios?.[0].id, 'ca:avp');
    assert.equal(built.problem.nutrients?.find((n) => n.id === 'amen_poultry')?.unit, 'kcal/kg');
  });

  test('a group with no chosen member is left out rather than sent empty', () => {
    const built = buildFormulaProblem(growerInputs({ ingredients: choose(1, 2) }), ctx());
    assert.ok(built.ok);
    assert.deepEqual(built.problem.groups, []);
  });

  test('refuses a larvae meal reared on poultry offal in a broiler formula, and says why', () => {
    const built = buildFormulaProblem(growerInputs({ ingredients: choose(1, 2, 7) }), ctx());
    assert.equal(built.ok, false);
    if (built.ok) return;
    assert.match(built.fieldErrors['ingredients[2].ingredientId'][0], /reared on a substrate .* chicken/);
    assert.match(built.message, /Choose an insect meal reared on another substrate/);
  });

  test('allows the same meal in a pig formula (the rule is per family)', () => {
    const built = buildFormulaProblem(growerInputs({ ingredients: choose(1, 2, 7), groups: [] }), ctx({ species: { name: 'Growing pig', family: 'swine' } }));
    assert.ok(built.ok);
  });

  test('an ingredient without a price asks for one; an entered price is enough', () => {
    const missing = buildFormulaProblem(growerInputs({ ingredients: choose(1, 8) }), ctx());
    assert.equal(missing.ok, false);
    if (!missing.ok) assert.match(missing.fieldErrors['ingredients[1].pricePerKg'][0], /Wheat bran has no price in the library/);
    const entered = buildFormulaProblem(growerInputs({ ingredients: [{ ingredientId: 1 }, { ingredientId: 8, pricePerKg: 0.17 }] }), ctx());
    assert.ok(entered.ok);
  });

  test('an ingredient from outside the library and an unknown nutrient are refused by name', () => {
    const built = buildFormulaProblem(growerInputs({ ingredients: choose(1, 999), nutrients: [{ nutrientId: 'xyz', min: 1 }] }), ctx());
    assert.equal(built.ok, false);
    if (built.ok) return;
    assert.match(built.fieldErrors['ingredients[1].ingredientId'][0], /no ingredient with id 999/);
    assert.match(built.fieldErrors['nutrients[0].nutrientId'][0], /not a nutrient/);
  });
});

describe('solving what the builder built', () => {
  test('limestone needed for a calcium floor follows from CaCO3 stoichiometry', () => {
    // Maize (Ca 0.02 %, typical) and limestone (Ca 40.04 %, [D]) held at exactly Ca 1.00 %:
    // x·40.04 + (1 − x)·0.02 = 1.00  →  x = 0.98 / 40.02 = 2.4488 % (arithmetic, [D]).
    const inputs = formulaInputsSchema.parse({ batchKg: 1000, ingredients: choose(1, 3), nutrients: [{ nutrientId: 'ca', min: 1.0, max: 1.0 }] });
    const { result } = solve(inputs);
    assert.equal(result.status, 'optimal');
    if (result.status !== 'optimal') return;
    close(result.mix.find((m) => m.id === '3')!.percent, (0.98 / 40.02) * 100, 1e-6, 'limestone %');
    close(result.mix.find((m) => m.id === '3')!.kg, (0.98 / 40.02) * 1000, 1e-4, 'limestone kg per 1,000 kg');
  });

  test('reported levels equal the mix recomputed from the library values as used', () => {
    const s = solve(growerInputs());
    assert.equal(s.result.status, 'optimal');
    if (s.result.status !== 'optimal') return;
    const total = s.result.mix.reduce((sum, m) => sum + m.kg, 0);
    close(total, 1000, 1e-6, 'batch total kg');
    for (const n of ['ca', 'cp', 'amen_poultry', 'na']) {
      const byHand = s.result.mix.reduce((sum, m) => sum + (m.kg / 1000) * (s.ingredients.find((u) => String(u.ingredientId) === m.id)!.values[n] ?? 0), 0);
      close(s.result.nutrients.find((r) => r.id === n)!.value, byHand, 1e-6 * Math.max(1, byHand), `${n} level`);
    }
    const cost = s.result.mix.reduce((sum, m) => sum + m.kg * s.ingredients.find((u) => String(u.ingredientId) === m.id)!.pricePerKg, 0);
    close(s.result.costPerBatch, cost, 1e-6, 'cost per batch');
    const bsf = s.result.groups.find((g) => g.id === groupId(0))!;
    assert.ok(bsf.percent <= 10 + 1e-7, `BSF meal ${bsf.percent} % within its 10 % cap`);
    assert.deepEqual(s.capWarnings, []);
  });

  test('raising an insect cap past the tested level warns, and never blocks the mix', () => {
    const cheapBsf = new Map(LIBRARY);
    cheapBsf.set(6, { ...BSF, pricePerKg: 0.05 });
    const inputs = growerInputs({ groups: [{ label: 'Black soldier fly meals in all', scope: 'insect_species', insectSpecies: 'hermetia_illucens', maxPct: 20, testedMaxPct: 10, source: 'Dabbou et al. 2018' }] });
    const s = solve(inputs, ctx({ library: cheapBsf }));
    assert.equal(s.result.status, 'optimal');
    assert.equal(s.capWarnings.length, 1);
    assert.ok(s.capWarnings[0].percent > 10);
    assert.match(s.capWarnings[0].message, /above the 10 % tested in feeding trials/);
  });

  test('an impossible protein floor comes back infeasible with the advice in words', () => {
    const s = solve(growerInputs({ nutrients: [{ nutrientId: 'cp', min: 60 }] }));
    assert.equal(s.result.status, 'infeasible');
    if (s.result.status !== 'infeasible') return;
    assert.ok(s.result.relaxations.length > 0);
    assert.match(s.result.relaxations[0].message, /Crude protein/i);
  });

  test('comparing two solves gives b minus a for cost, mix and levels', () => {
    const a = solve(growerInputs());
    const b = solve(growerInputs({ ingredients: [...choose(1, 3, 4, 5, 6, 9), { ingredientId: 2, pricePerKg: 0.7 }] }));
    assert.equal(a.result.status, 'optimal');
    assert.equal(b.result.status, 'optimal');
    if (a.result.status !== 'optimal' || b.result.status !== 'optimal') return;
    const diff = compareSolves(a, b);
    close(diff.cost.diffPerTonne!, b.result.costPerTonne - a.result.costPerTonne, 1e-9, 'cost difference');
    assert.ok(diff.cost.diffPerTonne! > 0, 'dearer soybean meal costs more per tonne');
    for (const line of diff.mix) close(line.diffPercent, line.bPercent - line.aPercent, 1e-12, `${line.name} difference`);
    const cp = diff.nutrients.find((n) => n.id === 'cp')!;
    close(cp.diff!, cp.b! - cp.a!, 1e-12, 'crude protein difference');
  });
});
