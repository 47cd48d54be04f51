/**
 * A plain comparison: the crude protein the planned meal supplies, and the area of soybean that would
 * grow the same crude protein in a year. It compares protein tonnage only: not amino acids, digestibility,
 * the oil and hulls a soybean crop also gives, nor the land behind the by-products the larvae ate.
 * Pure: no framework imports.
 */
import { DEFAULT_SOYBEAN_CP_PCT, DEFAULT_SOYBEAN_YIELD_T_PER_HA } from './substrates';

export type LandUseInput = {
  /** Crude protein in the meal, kg per week. */
  mealProteinKgPerWeek: number;
  /** Soybean grain yield, t/ha per year (default 2.8, from memory: FAOSTAT world average). */
  soybeanYieldTPerHa?: number;
  /** Crude protein of soybean grain, % as fed (default 37). */
  soybeanCpPct?: number;
  /** Weeks of rearing per year (default 52). */
  weeksPerYear?: number;
};

export type LandUseResult = {
  mealProteinKgPerWeek: number;
  mealProteinTPerYear: number;
  soybeanYieldTPerHa: number;
  soybeanCpPct: number;
  /** Soybean crude protein harvested per hectare per year, t. */
  soybeanProteinTPerHa: number;
  /** Hectares of soybean that give the meal's yearly protein. */
  soybeanHa: number;
  weeksPerYear: number;
};

/**
 * Hectares of soybean for the same crude protein: (protein per week × weeks) ÷ (yield × CP %).
 * @throws RangeError when the yield or the protein content is not above 0
 */
export function soybeanAreaForProtein(input: LandUseInput): LandUseResult {
  const soybeanYieldTPerHa = input.soybeanYieldTPerHa ?? DEFAULT_SOYBEAN_YIELD_T_PER_HA.value;
  const soybeanCpPct = input.soybeanCpPct ?? DEFAULT_SOYBEAN_CP_PCT.value;
  const weeksPerYear = input.weeksPerYear ?? 52;
  if (!(soybeanYieldTPerHa > 0)) throw new RangeError(`soybean yield must be above 0 t/ha, got ${soybeanYieldTPerHa}`);
  if (!(soybeanCpPct > 0 && soybeanCpPct <= 100)) throw new RangeError(`soybean protein must be above 0 and at most 100 %, got ${soybeanCpPct}`);
  const mealProteinTPerYear = (input.mealProteinKgPerWeek * weeksPerYear) / 1000;
  const soybeanProteinTPerHa = (soybeanYieldTPerHa * soybeanCpPct) / 100;
  return {
    mealProteinKgPerWeek: input.mealProteinKgPerWeek,
    mealProteinTPerYear,
    soybeanYieldTPerHa,
    soybeanCpPct,
    soybeanProteinTPerHa,
    soybeanHa: mealProteinTPerYear / soybeanProteinTPerHa,
    weeksPerYear,
  };
}
