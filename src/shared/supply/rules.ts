/**
 * Rules on what larvae may be reared on and who may eat the meal. Two separate things:
 * - feed-law notes per substrate and jurisdiction: flags with a plain note that local regulations decide;
 * - the insect-protein rule (src/shared/insect-rule.ts): a meal reared on a species' by-products is never
 *   offered to that species' diets. The planned meal is judged exactly like a library insect meal.
 * Pure: no framework imports.
 */
import { checkInsectSubstrate, refusedFamilies, type InsectRuleIngredient, type InsectRuleVerdict } from '../insect-rule';
import type { OriginAnimal, SpeciesFamily, SubstrateOrigin } from '../library-terms';
import { SUBSTRATES, type RegulatoryNote, type SubstrateKind } from './substrates';

/** Shown beside every substrate flag. */
export const LOCAL_RULES_NOTE = 'Feed law differs by country and changes: your local regulations decide what larvae for farm-animal feed may be reared on.';

export type SubstrateFlag = {
  streamIndex: number;
  streamName: string;
  substrate: SubstrateKind;
  /** Jurisdictions whose rules exclude this substrate, with their notes. */
  notAllowed: RegulatoryNote[];
  /** Jurisdictions that allow it only under conditions. */
  conditions: RegulatoryNote[];
};

/** The feed-law notes of every stream that has any; `notAllowed` non-empty means the stream is flagged. */
export function substrateFlags(streams: { name: string; substrate: SubstrateKind }[]): SubstrateFlag[] {
  return streams.flatMap((s, streamIndex) => {
    const notes = SUBSTRATES[s.substrate].regulatory;
    if (notes.length === 0) return [];
    return [{
      streamIndex,
      streamName: s.name || SUBSTRATES[s.substrate].label,
      substrate: s.substrate,
      notAllowed: notes.filter((n) => n.status === 'not_allowed'),
      conditions: notes.filter((n) => n.status === 'conditions'),
    }];
  });
}

/**
 * The planned meal as the insect-protein rule sees it: its substrates and the animals they came from.
 * @param streams the plan's streams, with the animals each came from (default: the substrate's)
 */
export function plannedMealForRule(name: string, streams: { substrate: SubstrateKind; animals?: OriginAnimal[] | null; tonnesPerWeek?: number }[]): InsectRuleIngredient {
  const used = streams.filter((s) => s.tonnesPerWeek === undefined || s.tonnesPerWeek > 0);
  const origins = new Set(used.map((s) => SUBSTRATES[s.substrate].origin));
  const animals = [...new Set(used.flatMap((s) => s.animals ?? SUBSTRATES[s.substrate].defaultAnimals))];
  let origin: SubstrateOrigin = 'plant';
  if (origins.has('mixed') || (origins.has('animal') && origins.has('plant'))) origin = 'mixed';
  else if (origins.has('animal')) origin = 'animal';
  if (origin === 'plant' && animals.length > 0) origin = 'mixed';
  return {
    name,
    category: 'insect_meal',
    substrate: [...new Set(used.map((s) => SUBSTRATES[s.substrate].label.toLowerCase()))].join(', '),
    substrateOrigin: origin,
    substrateAnimals: animals,
  };
}

/** Whether the planned meal may go into diets for `family`; the verdict's message says why not. */
export function mealOfferedTo(meal: InsectRuleIngredient, family: SpeciesFamily, speciesName?: string): InsectRuleVerdict {
  return checkInsectSubstrate(meal, family, speciesName);
}

/** The diet families the planned meal is never offered to. */
export function mealRefusedFamilies(meal: InsectRuleIngredient): SpeciesFamily[] {
  return refusedFamilies(meal);
}
