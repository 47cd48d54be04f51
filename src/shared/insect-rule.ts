/**
 * The rule on insect protein: an insect meal whose rearing substrate came from animals of a diet's own
 * family (poultry by-products for poultry, pig by-products for pigs) is never offered in that family's
 * diets, so no animal is fed back its own kind's by-products. The library and the engine both call this.
 * Pure: no framework imports.
 */
import {
  ORIGIN_ANIMALS,
  SPECIES_FAMILY_LABELS,
  type OriginAnimal,
  type SpeciesFamily,
  type SubstrateOrigin,
} from './library-terms';

/** What the rule needs to know about an ingredient. */
export type InsectRuleIngredient = {
  name: string;
  category: string;
  substrate?: string | null;
  substrateOrigin?: SubstrateOrigin | null;
  /** The animals an animal-origin substrate came from. */
  substrateAnimals?: readonly OriginAnimal[] | null;
};

/** `allowed` true, or false with the animals at fault and a sentence that says what to do. */
export type InsectRuleVerdict =
  | { allowed: true }
  | { allowed: false; code: 'same_species_substrate'; animals: OriginAnimal[]; message: string };

/**
 * Whether `ingredient` may be offered in a diet for `family`.
 * Only insect meals are judged; every other ingredient is allowed by this rule (other feed law still applies).
 * @param speciesName how the diet's species is named in the message, e.g. "Broiler chicken"
 */
export function checkInsectSubstrate(ingredient: InsectRuleIngredient, family: SpeciesFamily, speciesName?: string): InsectRuleVerdict {
  if (ingredient.category !== 'insect_meal') return { allowed: true };
  if (ingredient.substrateOrigin === 'plant') return { allowed: true };
  const animals = (ingredient.substrateAnimals ?? []).filter((animal) => ORIGIN_ANIMALS[animal]?.family === family);
  if (animals.length === 0) return { allowed: true };
  const who = speciesName ? `${speciesName} (${SPECIES_FAMILY_LABELS[family].toLowerCase()})` : SPECIES_FAMILY_LABELS[family].toLowerCase();
  const from = animals.map((animal) => ORIGIN_ANIMALS[animal].label.toLowerCase()).join(' and ');
  const substrate = ingredient.substrate ? ` (${ingredient.substrate})` : '';
  return {
    allowed: false,
    code: 'same_species_substrate',
    animals,
    message:
      `${ingredient.name} was reared on a substrate${substrate} from ${from}, so it cannot go into diets for ${who}: ` +
      'no animal may be fed insect protein grown on its own kind’s by-products. Choose an insect meal reared on another substrate.',
  };
}

/** The families whose diets must never include `ingredient`. */
export function refusedFamilies(ingredient: InsectRuleIngredient): SpeciesFamily[] {
  return (['poultry', 'swine'] as const).filter((family) => !checkInsectSubstrate(ingredient, family).allowed);
}
