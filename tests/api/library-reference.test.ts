import assert from 'node:assert/strict';
import { after, before, describe, test } from 'node:test';
import { and, eq, inArray, isNull, like } from 'drizzle-orm';

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
import { loadCatalogue } from '../../server/db/queries/lab-imports';
import { FIBRE_NUTRIENTS, REFERENCE_FIBRE_STEP } from '../../server/db/reference-data/fibre-fractions';
import { PULLET_SPECIFICATIONS, REFERENCE_PULLETS_STEP } from '../../server/db/reference-data/pullets';
import { copyIngredientsToOrganization } from '../../server/db/reference-data/seed-library';
import { DEMO_SEED_STEPS, REFERENCE_LIBRARY_STEP, seedDemoData } from '../../server/db/seed';
import { buildLabPreview } from '../../src/shared/lab-import';
import { asFedToDryMatter, kcalToMJ } from '../../src/shared/units';
import { createOrganization } from '../helpers/accounts';
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
    assert.deepEqual(await seedDemoData(database.db, [REFERENCE_LIBRARY_STEP, REFERENCE_PULLETS_STEP, REFERENCE_FIBRE_STEP]), ['reference-library-v1', 'reference-pullets-v1', 'reference-fibre-v1']);
  });
  after(async () => database?.drop());

  test('the catalogue covers the required nutrients, with each amino acid on three separate bases', async () => {
    const ids = new Set((await database.db.select({ id: nutrients.id }).from(nutrients)).map((n) => n.id));
    for (const id of ['dm', 'cp', 'ee', 'cf', 'adf', 'ndf', 'ash', 'starch', 'amen_poultry', 'de_swine', 'me_swine', 'ne_swine', 'ca', 'p', 'avp', 'sttd_p', 'na', 'cl', 'k', 'linoleic', 'lauric', 'chitin']) {
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
  test('NRC 1994 Table 2-1 (p. 19), white-egg pullets: four phases with the ten nutrients, total amino acids, every value marked as recalled', async () => {
    const wanted = ['amen_poultry', 'cp', 'lys', 'met', 'metcys', 'ca', 'avp', 'na', 'cl', 'linoleic'];
    const rows = await database.db
      .select({ spec: specifications, phase: phases, species: species })
      .from(specifications)
      .innerJoin(species, eq(species.id, specifications.speciesId))
      .innerJoin(phases, eq(phases.id, specifications.phaseId))
      .where(and(isNull(specifications.organizationId), eq(species.code, 'pullet')));
    assert.deepEqual(rows.map((r) => r.spec.code).sort(), ['nrc1994-pullet-0-6', 'nrc1994-pullet-12-18', 'nrc1994-pullet-18-lay', 'nrc1994-pullet-6-12']);
    assert.deepEqual(
      rows.sort((a, b) => a.phase.sortOrder - b.phase.sortOrder).map((r) => r.phase.span),
      ['0–6 weeks', '6–12 weeks', '12–18 weeks', '18 weeks to first egg'],
    );
    for (const { spec } of rows) {
      // The table is named with its page; the values were recalled, and the source says so.
      assert.match(spec.source, /NRC \(1994\).*Table 2-1 \(p\. 19\)/, `${spec.code} names its table`);
      assert.match(spec.source, /from memory/, `${spec.code} says its values are recalled`);
      assert.match(spec.notes ?? '', /Total amino acids/, `${spec.code} states the amino-acid basis`);
      const bounds = await database.db.select().from(specificationNutrients).where(eq(specificationNutrients.specificationId, spec.id));
      assert.deepEqual(bounds.map((b) => b.nutrientId).sort(), [...wanted].sort(), `${spec.code} bounds the ten nutrients`);
      for (const b of bounds) {
        assert.equal(b.confidence, 'from_memory', `${spec.code} ${b.nutrientId} is marked as recalled`);
        assert.match(b.note ?? '', /Table 2-1/, `${spec.code} ${b.nutrientId} names the table`);
        assert.ok(b.min !== null && b.min > 0 && b.max === null, `${spec.code} ${b.nutrientId} is a minimum`);
      }
      // Methionine is part of methionine + cystine (chemistry), and pullet diets hold more calcium than available P (common practice).
      const min = (id: string) => bounds.find((b) => b.nutrientId === id)!.min!;
      assert.ok(min('metcys') > min('met') && min('ca') > min('avp'), `${spec.code} is internally consistent`);
    }
    // The added phase ends at the first egg, not at a fixed age.
    const preLay = rows.find((r) => r.spec.code === 'nrc1994-pullet-18-lay')!.phase;
    assert.equal(preLay.ageFromDays, 126);
    assert.equal(preLay.ageToDays, null);
    assert.equal(PULLET_SPECIFICATIONS.length, rows.length);
  });

  test('NDF and ADF are in the catalogue, and the BSF larvae on brewers’ by-product carry the published values (Animals 2020, 10:682, Table 1: aNDF 13.0, ADF 7.92 % DM)', async () => {
    const rows = await database.db.select().from(nutrients).where(inArray(nutrients.id, ['adf', 'ndf']));
    assert.equal(rows.length, 2);
    for (const n of rows) {
      assert.equal(n.unit, '%');
      assert.equal(n.nutrientGroup, 'fat_and_fibre');
      assert.deepEqual([...n.families].sort(), ['poultry', 'swine']);
    }
    const ndf = await value('bsf-full-fat-brewery', 'ndf');
    const adf = await value('bsf-full-fat-brewery', 'adf');
    close(asFedToDryMatter(ndf.value, ndf.dm), 13.0, 1e-6, 'aNDF on DM');
    close(asFedToDryMatter(adf.value, adf.dm), 7.92, 1e-6, 'ADF on DM');
    // Same value set as the rest of that table, so the source and its dry matter travel with them.
    assert.equal(adf.source, (await value('bsf-full-fat-brewery', 'cp')).source);
    // No other reference ingredient has a detergent fibre value: none other was read in a source.
    const all = await database.db
      .select({ code: ingredients.code })
      .from(ingredientNutrientValues)
      .innerJoin(ingredients, eq(ingredients.id, ingredientNutrientValues.ingredientId))
      .where(and(isNull(ingredients.organizationId), inArray(ingredientNutrientValues.nutrientId, ['adf', 'ndf'])));
    assert.deepEqual(all.map((r) => r.code), ['bsf-full-fat-brewery', 'bsf-full-fat-brewery']);
  });

  test('a lab file with ADF and NDF columns stores them as nutrients and the pig net-energy equation finds ADF', async () => {
    const catalogue = await loadCatalogue(database.db);
    assert.ok(FIBRE_NUTRIENTS.every((n) => catalogue.some((c) => c.id === n.id)), 'the import sees NDF and ADF');
    const p = buildLabPreview('Sample,DM %,CP %,EE %,Ash %,NDF %,ADF %,Starch %\nW,88,12,2,1.8,11,3,58\n', { estimation: { classId: 'wheat', families: ['swine'] } }, catalogue);
    assert.equal(p.ok, true, JSON.stringify(p.issues));
    assert.deepEqual(p.fields.filter((f) => /DF/.test(f.key)).map((f) => f.mapping.target), ['ndf', 'adf']);
    const sample = p.samples[0];
    assert.equal(sample.values.find((v) => v.nutrientId === 'adf')?.origin, 'measured');
    const ne = sample.values.find((v) => v.nutrientId === 'ne_swine');
    assert.equal(ne?.method?.id, 'noblet_ne_from_me');
    // NE from ME on DM: 0.726 ME + 1.33 EE + 0.39 ST − 0.62 CP − 0.83 ADF, g/kg DM (Noblet et al. 1994, as given by NRC 2012).
    const me = sample.values.find((v) => v.nutrientId === 'me_swine')!;
    const g = (pct: number) => (pct * 10) / 0.88;
    close(ne!.dryMatter, 0.726 * me.dryMatter + 1.33 * g(2) + 0.39 * g(58) - 0.62 * g(12) - 0.83 * g(3), 1e-6, 'NE on DM');
  });
});

describe('a database that already holds the first reference library', () => {
  let database: TestDatabase;

  before(async () => {
    database = await createTestDatabase('library_reference_upgrade');
    await seedDemoData(database.db, [REFERENCE_LIBRARY_STEP]);
  });
  after(async () => database?.drop());

  test('gets the pullet specifications and the fibre fractions once, and an organization’s own copies are left as they were', async () => {
    const org = await createOrganization(database.db, 'Brackenfold Mill');
    const [bsf] = await database.db.select().from(ingredients).where(and(isNull(ingredients.organizationId), eq(ingredients.code, 'bsf-full-fat-brewery')));
    const copies = await copyIngredientsToOrganization(database.db, org.id, [bsf.id]);
    const ownCopy = copies.get(bsf.id)!;
    const pulletSpecs = () => database.db.select().from(specifications).where(and(isNull(specifications.organizationId), like(specifications.code, 'nrc1994-pullet-%')));
    assert.equal((await pulletSpecs()).length, 0);

    const steps = [REFERENCE_LIBRARY_STEP, REFERENCE_PULLETS_STEP, REFERENCE_FIBRE_STEP];
    assert.deepEqual(await seedDemoData(database.db, steps), ['reference-pullets-v1', 'reference-fibre-v1']);
    assert.equal((await pulletSpecs()).length, 4);
    const [after] = await database.db.select().from(ingredients).where(eq(ingredients.id, bsf.id));
    assert.equal(after.version, bsf.version + 1, 'the reference ingredient changed, so its version rose');
    const ownValues = await database.db.select().from(ingredientNutrientValues).where(and(eq(ingredientNutrientValues.ingredientId, ownCopy), inArray(ingredientNutrientValues.nutrientId, ['adf', 'ndf'])));
    assert.equal(ownValues.length, 0, 'the organization’s copy is its own');

    assert.deepEqual(await seedDemoData(database.db, steps), []);
    assert.equal((await pulletSpecs()).length, 4);
  });

  test('the demo data applies the new steps right after the first library, before anything is copied from it', () => {
    const names = DEMO_SEED_STEPS.map((s) => s.name);
    const first = names.indexOf('reference-library-v1');
    assert.deepEqual(names.slice(first, first + 3), ['reference-library-v1', 'reference-pullets-v1', 'reference-fibre-v1']);
    assert.ok(names.indexOf('reference-fibre-v1') < names.indexOf('demo-libraries-v1'));
  });
});
