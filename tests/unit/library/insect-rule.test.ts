import assert from 'node:assert/strict';
import { describe, test } from 'node:test';

import { checkInsectSubstrate, refusedFamilies } from '../../../src/shared/insect-rule';

const meal = (over: Partial<Parameters<typeof checkInsectSubstrate>[0]> = {}) => ({
  name: 'Larvae meal',
  category: 'insect_meal',
  substrate: 'Poultry processing offal',
  substrateOrigin: 'animal' as const,
  substrateAnimals: ['chicken' as const],
  ...over,
});

// The rule follows the intra-species recycling ban: poultry feed must not contain poultry-derived protein,
// pig feed no pig-derived protein (EU Reg. 999/2001 Annex IV as amended by Reg. (EU) 2021/1372).
describe('the insect-protein rule', () => {
  test('refuses a meal reared on chicken offal for poultry, with a message that says what to do', () => {
    const verdict = checkInsectSubstrate(meal(), 'poultry', 'Broiler chicken');
    assert.equal(verdict.allowed, false);
    if (verdict.allowed) return;
    assert.deepEqual(verdict.animals, ['chicken']);
    assert.match(verdict.message, /Broiler chicken/);
    assert.match(verdict.message, /chicken/);
    assert.match(verdict.message, /Choose an insect meal reared on another substrate/);
  });

  test('allows the same meal for pigs, and refuses a pig-offal meal for pigs only', () => {
    assert.equal(checkInsectSubstrate(meal(), 'swine').allowed, true);
    const pig = meal({ substrate: 'Pig slaughter by-products', substrateAnimals: ['pig'] });
    assert.equal(checkInsectSubstrate(pig, 'swine').allowed, false);
    assert.equal(checkInsectSubstrate(pig, 'poultry').allowed, true);
    assert.deepEqual(refusedFamilies(pig), ['swine']);
  });

  test('turkey or duck by-products count as poultry', () => {
    assert.equal(checkInsectSubstrate(meal({ substrateAnimals: ['turkey'] }), 'poultry').allowed, false);
    assert.equal(checkInsectSubstrate(meal({ substrateAnimals: ['duck'] }), 'poultry').allowed, false);
  });

  test('a mixed substrate with poultry and pig parts is refused for both families', () => {
    assert.deepEqual(refusedFamilies(meal({ substrateOrigin: 'mixed', substrateAnimals: ['fish', 'chicken', 'pig'] })), ['poultry', 'swine']);
  });

  test('plant substrates, fish or cattle origins and non-insect ingredients are not refused by this rule', () => {
    assert.deepEqual(refusedFamilies(meal({ substrateOrigin: 'plant', substrateAnimals: [] })), []);
    assert.deepEqual(refusedFamilies(meal({ substrateAnimals: ['fish'] })), []);
    assert.deepEqual(refusedFamilies(meal({ substrateAnimals: ['cattle'] })), []);
    assert.deepEqual(refusedFamilies({ name: 'Fish meal', category: 'animal_protein', substrateAnimals: ['chicken'] }), []);
  });
});
