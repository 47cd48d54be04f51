import { and, eq, inArray, isNull, or } from 'drizzle-orm';
import type { z } from 'zod';

import { checkInsectSubstrate } from '../../../src/shared/insect-rule';
import type { OriginAnimal } from '../../../src/shared/library-terms';
import type { Measures } from '../../../src/shared/measures';
import { checkRation, type RationLine, type Requirement } from '../../../src/shared/ration-check';
import type { RationCheckResponse, RationChoices, rationCheckInput } from '../../../src/shared/schemas/ration-checks';
import { badRequest } from '../../http/errors';
import type { Db } from '../client';
import { ingredientNutrientValues, ingredients, nutrients } from '../schema';
import { listIngredients } from './ingredients';
import { getMeasures } from './organization-settings';
import { getSpecification, listSpecifications } from './specifications';

/** Nutrients a farmer may type for an ingredient not in the library (catalogue ids). */
const TYPED_NUTRIENTS = ['cp', 'lys', 'met', 'metcys', 'thr', 'sid_lys', 'sid_met', 'dig_lys', 'ca', 'p', 'avp', 'sttd_p', 'na', 'amen_poultry', 'ne_swine', 'me_swine', 'ee', 'cf', 'dm'];

/** What the phone offers: own and reference specifications and ingredients, and the nutrients to type. */
export async function rationChoices(db: Db, organizationId: number): Promise<RationChoices> {
  const specifications: RationChoices['specifications'] = [];
  const items: RationChoices['ingredients'] = [];
  for (const library of ['own', 'reference'] as const) {
    const specs = await listSpecifications(db, organizationId, { library, page: 1, pageSize: 200 });
    for (const s of specs.items) specifications.push({ id: s.id, name: s.name, source: s.source, species: s.species.name, phase: s.phase?.name ?? null, library });
    for (let page = 1; ; page++) {
      const batch = await listIngredients(db, organizationId, { library, page, pageSize: 200 });
      for (const i of batch.items) items.push({ id: i.id, name: i.name, category: i.category, pricePerKg: i.pricePerKg, library });
      if (page * 200 >= batch.total) break;
    }
  }
  const rows = await db.select({ id: nutrients.id, name: nutrients.name, unit: nutrients.unit }).from(nutrients).where(inArray(nutrients.id, TYPED_NUTRIENTS));
  const order = new Map(TYPED_NUTRIENTS.map((id, k) => [id, k]));
  return { specifications, ingredients: items, nutrients: rows.sort((a, b) => order.get(a.id)! - order.get(b.id)!) };
}

/**
 * Checks a ration: library ingredients are read with every value (the typed values replace them), the
 * insect-protein rule is judged for the specification's species, and the engine evaluates the mix and
 * looks for the cheapest correction. Nothing is saved.
 */
export async function runRationCheck(db: Db, organizationId: number, input: z.output<typeof rationCheckInput>, measuresFor?: Measures): Promise<RationCheckResponse> {
  const spec = await getSpecification(db, organizationId, input.specificationId).catch(() => {
    throw badRequest(`specificationId: no specification with id ${input.specificationId}`, { specificationId: [`no specification with id ${input.specificationId}: choose the animal and phase again`] });
  });
  const ids = input.lines.flatMap((l) => (l.ingredientId ? [l.ingredientId] : []));
  const rows = ids.length ? await db.select().from(ingredients).where(and(inArray(ingredients.id, ids), or(isNull(ingredients.organizationId), eq(ingredients.organizationId, organizationId)))) : [];
  const values = rows.length ? await db.select().from(ingredientNutrientValues).where(inArray(ingredientNutrientValues.ingredientId, rows.map((r) => r.id))) : [];
  const fieldErrors: Record<string, string[]> = {};
  const typed = [...new Set(input.lines.flatMap((l) => Object.keys(l.values ?? {})))];
  const known = new Set((typed.length ? await db.select({ id: nutrients.id }).from(nutrients).where(inArray(nutrients.id, typed)) : []).map((n) => n.id));
  input.lines.forEach((l, k) => {
    for (const id of Object.keys(l.values ?? {})) if (!known.has(id)) (fieldErrors[`lines[${k}].values.${id}`] ??= []).push(`“${id}” is not a nutrient in the catalogue`);
  });
  const lines: RationLine[] = input.lines.map((l, k) => {
    if (!l.ingredientId) return { key: `typed-${k + 1}`, name: l.name!, kg: l.kg, pricePerKg: l.pricePerKg ?? null, values: { ...l.values } };
    const row = rows.find((r) => r.id === l.ingredientId);
    if (!row) {
      fieldErrors[`lines[${k}].ingredientId`] = [`no ingredient with id ${l.ingredientId} in your library`];
      return { key: `x-${k}`, name: '', kg: 0, pricePerKg: 0, values: {} };
    }
    const own = Object.fromEntries(values.filter((v) => v.ingredientId === row.id).map((v) => [v.nutrientId, v.value]));
    const verdict = checkInsectSubstrate({ ...row, substrateAnimals: (row.substrateAnimals ?? null) as OriginAnimal[] | null }, spec.species.family, spec.species.name);
    return {
      key: `lib-${row.id}`,
      name: l.name || row.name,
      kg: l.kg,
      pricePerKg: l.pricePerKg ?? (row.pricePerKg === null ? null : Number(row.pricePerKg)),
      values: { ...own, ...l.values },
      refused: verdict.allowed ? null : verdict.message,
    };
  });
  const first = Object.entries(fieldErrors)[0];
  if (first) throw badRequest(`${first[0]}: ${first[1][0]}`, fieldErrors);

  const wanted = [...new Set([...spec.bounds.map((b) => b.nutrientId), ...spec.ratios.flatMap((r) => [r.numeratorId, r.denominatorId])])];
  const info = new Map((wanted.length ? await db.select().from(nutrients).where(inArray(nutrients.id, wanted)) : []).map((n) => [n.id, n]));
  const requirement: Requirement = {
    name: spec.name,
    source: spec.source,
    bounds: spec.bounds.filter((b) => b.min != null || b.max != null).map((b) => ({ nutrientId: b.nutrientId, name: info.get(b.nutrientId)?.name ?? b.nutrientId, unit: info.get(b.nutrientId)?.unit ?? '', min: b.min, max: b.max })),
    ratios: spec.ratios.map((r) => ({ numeratorId: r.numeratorId, denominatorId: r.denominatorId, name: `${info.get(r.numeratorId)?.name ?? r.numeratorId} : ${info.get(r.denominatorId)?.name ?? r.denominatorId}`, min: r.min, max: r.max })),
  };
  const measures = measuresFor ?? (await getMeasures(db, organizationId));
  const result = checkRation(lines, requirement, { system: measures.unitSystem, currency: measures.currency, maxAddPercent: input.maxAddPercent });
  return {
    requirement: { specificationId: spec.id, name: spec.name, source: spec.source, species: spec.species.name, phase: spec.phase?.name ?? null },
    measures,
    lines: lines.map((l, k) => ({ key: l.key, name: l.name, kg: l.kg, pricePerKg: l.pricePerKg, fromLibrary: !!input.lines[k].ingredientId })),
    result,
    checkedAt: new Date().toISOString(),
  };
}
