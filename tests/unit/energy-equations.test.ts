import assert from 'node:assert/strict';
import { describe, test } from 'node:test';

import { applyEnergyEquation, ENERGY_EQUATIONS, energyEquation, nitrogenFreeExtract, type EnergyEquation } from '../../src/shared/energy-equations';

const close = (actual: number, expected: number, tolerance: number, what: string) =>
  assert.ok(Math.abs(actual - expected) <= tolerance, `${what}: got ${actual}, expected ${expected} ± ${tolerance}`);

const eq = (id: string): EnergyEquation => {
  const found = energyEquation(id);
  assert.ok(found, `equation ${id}`);
  return found;
};

// Maize as fed: DM 89, CP 8.5, EE 3.8, CF 2.2, ash 1.3 %, so NFE = 73.2 %.
const MAIZE = { dm: 89, cp: 8.5, ee: 3.8, cf: 2.2, ash: 1.3 };

describe('poultry AMEn from the proximate analysis', () => {
  test('maize: Janssen (1989) equation gives 3,359.9 kcal/kg as fed and 3,775.2 kcal/kg DM', () => {
    // NRC (1994) Nutrient Requirements of Poultry, Appendix B, Table B-1 (p. 114), corn grain:
    // MEn = 36.21 CP + 85.44 EE + 37.26 NFE; 36.21×8.5 + 85.44×3.8 + 37.26×73.2 = 3,359.9 kcal/kg as fed.
    close(nitrogenFreeExtract(MAIZE)!, 73.2, 1e-9, 'NFE');
    const r = applyEnergyEquation(eq('janssen_maize'), MAIZE);
    assert.ok(r.ok);
    close(r.asFed, 3359.9, 0.05, 'AMEn as fed');
    close(r.dryMatter, 3775.2, 0.05, 'AMEn per kg DM');
  });

  test('the no-intercept equations give the same as-fed value from DM inputs: the basis rule', () => {
    // Derived: an equation without intercept is of degree 1 in its inputs, so % DM in → kcal/kg DM out.
    const dmBasis = { dm: 100, cp: 8.5 / 0.89, ee: 3.8 / 0.89, cf: 2.2 / 0.89, ash: 1.3 / 0.89 };
    const r = applyEnergyEquation(eq('janssen_maize'), dmBasis);
    assert.ok(r.ok);
    close(r.asFed, 3775.2, 0.05, 'kcal/kg DM when the feed is dry matter');
  });

  test('soybean meal: ME = 2,778 − 66 × CF gives 2,461 kcal/kg at CF 4.8 % (88 % DM)', () => {
    // University of Georgia Poultry Extension, "Soybeans: metabolizable energy", worked example in the text.
    const r = applyEnergyEquation(eq('soybean_meal_fibre'), { dm: 88, cf: 4.8, cp: 47 });
    assert.ok(r.ok);
    close(r.asFed, 2461.2, 0.05, 'ME at 88 % DM');
    // The same meal dried to 90 % DM has the same fibre per kg DM and so 90/88 of the energy per kg as fed.
    const drier = applyEnergyEquation(eq('soybean_meal_fibre'), { dm: 90, cf: (4.8 * 90) / 88 });
    assert.ok(drier.ok);
    close(drier.asFed, (2461.2 * 90) / 88, 0.05, 'ME at 90 % DM');
  });

  test('says which inputs are missing instead of guessing', () => {
    const r = applyEnergyEquation(eq('janssen_maize'), { dm: 89, cp: 8.5, ee: 3.8 });
    assert.equal(r.ok, false);
    if (r.ok) return;
    assert.deepEqual(r.missing, ['nfe']);
    assert.match(r.message, /nitrogen-free extract/);
    const noDm = applyEnergyEquation(eq('janssen_fish_meal'), { ash: 15, ee: 9 });
    assert.equal(noDm.ok, false);
  });

  test('fish meal equation: 35.87 DM − 34.08 ash + 42.09 EE', () => {
    // NRC (1994) Table B-1, fish meal (Janssen 1989); arithmetic on a meal of DM 92, ash 16, EE 9 % as fed:
    // 35.87×92 − 34.08×16 + 42.09×9 = 3,300.04 − 545.28 + 378.81 = 3,133.57 kcal/kg as fed.
    const r = applyEnergyEquation(eq('janssen_fish_meal'), { dm: 92, ash: 16, ee: 9 });
    assert.ok(r.ok);
    close(r.asFed, 3133.57, 0.01, 'fish meal AMEn');
  });
});

describe('pig energy', () => {
  // A pig feed on a DM basis in g/kg: CP 180, EE 40, starch 450, ADF 60; DE 4,000 kcal/kg DM.
  const feedAsFed = (dm: number) => ({ dm, cp: 18 * dm / 100, ee: 4 * dm / 100, starch: 45 * dm / 100, adf: 6 * dm / 100, de: 4000 * dm / 100 });

  test('NE from DE matches the MJ form printed by Li et al. (2018)', () => {
    // Li et al. (2018), J. Anim. Sci. Biotechnol. 9:39, Fig. 5: NE = 0.7 × DE + [1.61 EE + 0.48 starch − 0.91 CP − 0.87 ADF] / 1000 × 4.184,
    // DE and NE in MJ/kg, nutrients in g/kg. Computed here in MJ and converted with 1 MJ = 1000 / 4.184 kcal.
    const deMJ = (4000 * 4.184) / 1000;
    const printedMJ = 0.7 * deMJ + ((1.61 * 40 + 0.48 * 450 - 0.91 * 180 - 0.87 * 60) / 1000) * 4.184;
    const r = applyEnergyEquation(eq('noblet_ne_from_de'), feedAsFed(88));
    assert.ok(r.ok);
    close(r.dryMatter, (printedMJ * 1000) / 4.184, 1e-6, 'NE kcal/kg DM');
    close(r.asFed, ((printedMJ * 1000) / 4.184) * 0.88, 1e-6, 'NE kcal/kg as fed at 88 % DM');
  });

  test('NE from ME uses the NRC (2012) coefficients 0.726, 1.33, 0.39, −0.62, −0.83 on a DM basis', () => {
    // NRC (2012) / Noblet et al. (1994) NE = 0.726 ME + 1.33 EE + 0.39 ST − 0.62 CP − 0.83 ADF (kcal/kg DM, g/kg DM):
    // 0.726×3,850 + 1.33×40 + 0.39×450 − 0.62×180 − 0.83×60 = 2,795.1 + 53.2 + 175.5 − 111.6 − 49.8 = 2,862.4.
    const feed = { ...feedAsFed(90), me: 3850 * 0.9 };
    const r = applyEnergyEquation(eq('noblet_ne_from_me'), feed);
    assert.ok(r.ok);
    close(r.dryMatter, 2862.4, 1e-6, 'NE per kg DM');
    const again = applyEnergyEquation(eq('noblet_ne_from_me'), { ...feedAsFed(60), me: 3850 * 0.6 });
    assert.ok(again.ok);
    close(again.dryMatter, 2862.4, 1e-6, 'the same DM composition at another moisture');
  });

  test('equations recalled from memory say so', () => {
    for (const id of ['noblet_perez_de', 'nrc1998_me_from_de']) {
      assert.equal(eq(id).confidence, 'from_memory');
      assert.match(eq(id).caution ?? '', /recalled/);
    }
  });
});

describe('the equation list', () => {
  test('every equation names its source and formula, and has a unique id', () => {
    const ids = new Set<string>();
    for (const e of ENERGY_EQUATIONS) {
      assert.ok(!ids.has(e.id), e.id);
      ids.add(e.id);
      assert.ok(e.source.length > 20 && e.formula.includes('='), e.id);
      if (e.basis !== 'homogeneous') assert.ok(e.caution, `${e.id} has an intercept and must carry a caution`);
    }
  });
});
