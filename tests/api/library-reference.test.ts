import assert from 'node:assert/strict';
import { after, before, describe, test } from 'node:test';
import { and, eq, isNull } from 'drizzle-orm';

import {
  ingredientNutrientValues,
  ingredients,
  ingredientValueSets,
  nutrients,
  phases,
  species,
  specificationNutrients,
  specifications,
} from '../../server/db/schema';
import { REFERENCE_LIBRARY_STEP, seedDemoData } from '../../server/db/seed';
import { asFedToDryMatter, kcalToMJ } from '../../src/shared/units';
import { createTestDatabase, type TestDatabase } from '../helpers/db';

const close = (actual: number, expected: number, tolerance: number, what: string) =>
  assert.ok(Math.abs(actual - expected) <= tolerance, `${what}: got ${actual}, expected ${expected} ± ${tolerance}`);

/** IUPAC standard atomic weights (abridged, conventional values), for checking mineral and amino-acid contents. */
const ATOMIC = { H: 1.008, C: 12.011, N: 14.007, O: 15.999, Na: 22.99, P: 30.974, Cl: 35.45, Ca: 40.078 };
const mass = (formula: Partial<Record<keyof typeof ATOMIC, number>>) => Object.entries(formula).reduce((sum, [el, n]) => sum + ATOMIC[el as keyof typeof ATOMIC] * n!, 0);

describe('the reference library as seeded', () => {
  let database: TestDatabase;

  /** Stored as-fed value of a reference ingredient, with the DM of its value set. */
  const value = async (code: string, nutrientId: string) => {
    const [row] = await database.db
      .select({ value: ingredientNutrientValues.value, dm: ingredientValueSets.dryMatterPct, confidence: ingredientValueSets.confidence, source: ingredientValueSets.sourceName })
      .from(ingredientNutrientValues)
      .innerJoin(ingredients, eq(ingredients.id, ingredientNutrientValues.ingredientId))
      .innerJoin(ingredientValueSets, eq(ingredientValueSets.id, ingredientNutrientValues.valueSetId))
      .where(and(isNull(ingredients.organizationId), eq(ingredients.code, code), eq(ingredientNutrientValues.nutrientId, nutrientId)));
    assert.ok(row, `${code} has a ${nutrientId} value`);
    return row;
  };

  /** Minimum of a nutrient in a reference specification. */
  const bound = async (code: string, nutrientId: string) => {
    const [row] = await database.db
      .select({ min: specificationNutrients.min, confidence: specificationNutrients.confidence })
      .from(specificationNutrients)
      .innerJoin(specifications, eq(specifications.id, specificationNutrients.specificationId))
      .where(and(isNull(specifications.organizationId), eq(specifications.code, code), eq(specificationNutrients.nutrientId, nutrientId)));
    assert.ok(row, `${code} bounds ${nutrientId}`);
    return row;
  };

  before(async () => {
    database = await createTestDatabase('library_reference');
    assert.deepEqual(await seedDemoData(database.db, [REFERENCE_LIBRARY_STEP]), ['reference-library-v1']);
  });
  after(async () => database?.drop());

  test('the catalogue covers the required nutrients, with each amino acid on three separate bases', async () => {
    const ids = new Set((await database.db.select({ id: nutrients.id }).from(nutrients)).map((n) => n.id));
    for (const id of ['dm', 'cp', 'ee', 'cf', 'ash', 'starch', 'amen_poultry', 'de_swine', 'me_swine', 'ne_swine', 'ca', 'p', 'avp', 'sttd_p', 'na', 'cl', 'k', 'linoleic', 'lauric', 'chitin']) {
      assert.ok(ids.has(id), `catalogue has ${id}`);
    }
    for (const aa of ['lys', 'met', 'metcys', 'thr', 'trp', 'arg', 'ile', 'val', 'leu']) {
      for (const id of [aa, `dig_${aa}`, `sid_${aa}`]) assert.ok(ids.has(id), `catalogue has ${id}`);
    }
  });

  test('NRC 1994 broiler rows match the published table (Merck Veterinary Manual, “Nutrient Requirements of Broilers”, adapted from NRC 1994)', async () => {
    assert.equal((await bound('nrc1994-broiler-starter', 'cp')).min, 23.0);
    assert.equal((await bound('nrc1994-broiler-starter', 'lys')).min, 1.1);
    assert.equal((await bound('nrc1994-broiler-grower', 'metcys')).min, 0.72);
    assert.equal((await bound('nrc1994-broiler-finisher', 'thr')).min, 0.68);
    assert.equal((await bound('nrc1994-broiler-grower', 'amen_poultry')).min, 3200);
    assert.equal((await bound('nrc1994-broiler-starter', 'lys')).confidence, 'verified');
    // Calcium was not read in that table: it must say so.
    assert.equal((await bound('nrc1994-broiler-starter', 'ca')).confidence, 'from_memory');
  });

  test('NRC 2012 growing-pig phosphorus and salt rows match their checked sources', async () => {
    // STTD P 0.33 % at 11–25 kg: Univ. Illinois Stein Monogastric Nutrition Lab, nutrition.ansci.illinois.edu/node/1055.
    assert.equal((await bound('nrc2012-pig-11-25', 'sttd_p')).min, 0.33);
    // 0.31, 0.27, 0.24, 0.21 % at 100 % of NRC 2012: Vier et al. 2019, J. Anim. Sci. 97:4023–4031, Table 2 footnotes.
    assert.deepEqual(
      await Promise.all(['25-50', '50-75', '75-100', '100-135'].map(async (band) => (await bound(`nrc2012-pig-${band}`, 'sttd_p')).min)),
      [0.31, 0.27, 0.24, 0.21],
    );
    // Na 0.35 %, Cl 0.45 % for 7–11 kg pigs: Shawk et al., Kansas State, National Hog Farmer 15 Mar 2017.
    assert.equal((await bound('nrc2012-pig-7-11', 'na')).min, 0.35);
    assert.equal((await bound('nrc2012-pig-7-11', 'cl')).min, 0.45);
    assert.equal((await bound('nrc2012-pig-7-11', 'cl')).confidence, 'verified');
    assert.equal((await bound('nrc2012-pig-25-50', 'sid_lys')).confidence, 'from_memory');
  });

  test('lactating-sow rows match Table 6.3 of The Gestating and Lactating Sow (Farmer, ed., 2015)', async () => {
    assert.equal((await bound('sow-lactation-p1', 'sid_lys')).min, 0.89);
    assert.equal((await bound('sow-lactation-p2', 'sttd_p')).min, 0.37);
    assert.equal((await bound('sow-lactation-p1', 'ca')).min, 0.78);
  });

  test('mineral and amino-acid sources match the chemistry of the pure compounds (IUPAC atomic weights)', async () => {
    const salt = mass({ Na: 1, Cl: 1 });
    close((await value('salt', 'na')).value, (100 * ATOMIC.Na) / salt, 0.01, 'Na in NaCl');
    close((await value('salt', 'cl')).value, (100 * ATOMIC.Cl) / salt, 0.01, 'Cl in NaCl');
    close((await value('limestone', 'ca')).value, (100 * ATOMIC.Ca) / mass({ Ca: 1, C: 1, O: 3 }), 0.01, 'Ca in CaCO3');
    const dcp = mass({ Ca: 1, H: 5, P: 1, O: 6 }); // CaHPO4·2H2O
    close((await value('dicalcium-phosphate', 'ca')).value, (100 * ATOMIC.Ca) / dcp, 0.01, 'Ca in CaHPO4·2H2O');
    close((await value('dicalcium-phosphate', 'p')).value, (100 * ATOMIC.P) / dcp, 0.01, 'P in CaHPO4·2H2O');
    const mcp = mass({ Ca: 1, H: 6, P: 2, O: 9 }); // Ca(H2PO4)2·H2O
    close((await value('monocalcium-phosphate', 'p')).value, (200 * ATOMIC.P) / mcp, 0.01, 'P in Ca(H2PO4)2·H2O');
    close((await value('sodium-bicarbonate', 'na')).value, (100 * ATOMIC.Na) / mass({ Na: 1, H: 1, C: 1, O: 3 }), 0.01, 'Na in NaHCO3');
    const lysine = mass({ C: 6, H: 14, N: 2, O: 2 });
    const lysHcl = lysine + ATOMIC.H + ATOMIC.Cl;
    close((await value('l-lysine-hcl', 'lys')).value, (100 * lysine) / lysHcl, 0.01, 'Lys in L-Lys·HCl');
    close((await value('l-lysine-hcl', 'cp')).value, ((100 * 2 * ATOMIC.N) / lysHcl) * 6.25, 0.05, 'CP (N × 6.25) of L-Lys·HCl');
    assert.equal((await value('l-lysine-hcl', 'lys')).confidence, 'derived');
    // Feed-grade values that were not checked say so.
    assert.equal((await value('limestone', 'ash')).confidence, 'from_memory');
  });

  test('insect meals published per kg DM read back their published values on a DM basis', async () => {
    // Animals 2020, 10:682 (PMC7222827), Table 1: BSF larvae on brewers' by-product, CP 49.1 % DM, EE 36.6, Ca 18.5 g/kg DM.
    const cp = await value('bsf-full-fat-brewery', 'cp');
    close(asFedToDryMatter(cp.value, cp.dm), 49.1, 1e-6, 'CP on DM');
    const ca = await value('bsf-full-fat-brewery', 'ca');
    close(asFedToDryMatter(ca.value, ca.dm) * 10, 18.5, 1e-6, 'Ca g/kg DM');
    // Schiavone et al. 2017: AMEn 14.87 MJ/kg DM for partially defatted BSF meal in broilers.
    const amen = await value('bsf-partially-defatted', 'amen_poultry');
    close(kcalToMJ(asFedToDryMatter(amen.value, amen.dm)), 14.87, 0.0005, 'AMEn MJ/kg DM');
    // Spranghers et al. 2017: prepupae on vegetable waste, EE 371 g/kg DM.
    const ee = await value('bsf-prepupae-vegetable', 'ee');
    close(asFedToDryMatter(ee.value, ee.dm) * 10, 371, 1e-6, 'EE g/kg DM');
    // Sci. Rep. 2025, s41598-025-05624-7, Table 5 (as fed): CP 58.5 %, total Lys 3.04 %.
    assert.equal((await value('bsf-defatted', 'cp')).value, 58.5);
    assert.equal((await value('bsf-defatted', 'lys')).value, 3.04);
    // Nascimento Filho et al.: T. molitor AMEn 5,004 kcal/kg DM.
    const tm = await value('mealworm-full-fat', 'amen_poultry');
    close(asFedToDryMatter(tm.value, tm.dm), 5004, 1e-6, 'mealworm AMEn on DM');
  });

  test('every insect meal records its insect, processing and substrate; animal substrates name their animals', async () => {
    const meals = await database.db.select().from(ingredients).where(and(isNull(ingredients.organizationId), eq(ingredients.category, 'insect_meal')));
    const insects = new Set(meals.map((m) => m.insectSpecies));
    for (const insect of ['hermetia_illucens', 'tenebrio_molitor', 'musca_domestica']) assert.ok(insects.has(insect as never), `a ${insect} meal`);
    assert.ok(meals.some((m) => m.insectProcessing === 'full_fat') && meals.some((m) => m.insectProcessing === 'defatted'));
    for (const m of meals) {
      assert.ok(m.substrate && m.substrateOrigin, `${m.name} has a substrate`);
      if (m.substrateOrigin === 'animal' || m.substrateOrigin === 'mixed') assert.ok(m.substrateAnimals?.length, `${m.name} names the animals`);
    }
  });

  test('every value set names its source and confidence; specifications and caps name theirs; bounds use nutrients of their family', async () => {
    const sets = await database.db.select().from(ingredientValueSets);
    assert.ok(sets.length > 30);
    for (const s of sets) assert.ok(s.sourceName.length > 10 && s.confidence && s.dryMatterPct > 0 && s.dryMatterPct <= 100, `value set ${s.id}`);
    const rows = await database.db
      .select({ spec: specifications.code, family: species.family, nutrient: nutrients.id, families: nutrients.families })
      .from(specificationNutrients)
      .innerJoin(specifications, eq(specifications.id, specificationNutrients.specificationId))
      .innerJoin(species, eq(species.id, specifications.speciesId))
      .innerJoin(nutrients, eq(nutrients.id, specificationNutrients.nutrientId));
    for (const r of rows) assert.ok(r.families.includes(r.family), `${r.spec}: ${r.nutrient} is a ${r.family} nutrient`);
    const specs = await database.db.select().from(specifications);
    for (const s of specs) assert.ok(s.source.length > 10, `${s.code} names its table`);
    const phaseCount = (await database.db.select().from(phases)).length;
    assert.ok(phaseCount >= 15);
  });
});
