/**
 * Unit conversions for nutrient values. Pure functions, no framework imports.
 *
 * Conventions:
 * - Nutrient values are stored per kg of feed **as fed**, each with the dry matter (DM, % of the
 *   feed) it refers to. A value on a DM basis is the same amount per kg of dry matter.
 * - 1 % = 10 g/kg = 10,000 mg/kg (mg/kg is ppm).
 * - Energy uses the thermochemical calorie: 1 kcal = 4.184 kJ, so 1 MJ = 239.006 kcal.
 */
import type { NutrientUnit } from './library-terms';

/** kJ per kcal (thermochemical calorie). */
export const KJ_PER_KCAL = 4.184;

/**
 * As-fed value → dry-matter value: value × 100 / DM.
 * @param value amount per kg as fed, any unit
 * @param dryMatterPct dry matter of the feed, % (0 < DM <= 100)
 * @returns the same unit per kg of dry matter
 */
export function asFedToDryMatter(value: number, dryMatterPct: number): number {
  assertDryMatter(dryMatterPct);
  return (value * 100) / dryMatterPct;
}

/**
 * Dry-matter value → as-fed value: value × DM / 100.
 * @param value amount per kg of dry matter, any unit
 * @param dryMatterPct dry matter of the feed, % (0 < DM <= 100)
 */
export function dryMatterToAsFed(value: number, dryMatterPct: number): number {
  assertDryMatter(dryMatterPct);
  return (value * dryMatterPct) / 100;
}

function assertDryMatter(dryMatterPct: number) {
  if (!(dryMatterPct > 0 && dryMatterPct <= 100)) throw new RangeError(`dry matter must be above 0 and at most 100 %, got ${dryMatterPct}`);
}

/** % of feed → g/kg (× 10). */
export const percentToGPerKg = (percent: number): number => percent * 10;
/** g/kg → % of feed (÷ 10). */
export const gPerKgToPercent = (gPerKg: number): number => gPerKg / 10;
/** % of feed → mg/kg (ppm) (× 10,000). */
export const percentToMgPerKg = (percent: number): number => percent * 10_000;
/** mg/kg (ppm) → % of feed (÷ 10,000). */
export const mgPerKgToPercent = (mgPerKg: number): number => mgPerKg / 10_000;
/** kcal → MJ (× 4.184 / 1,000); per kg stays per kg. */
export const kcalToMJ = (kcal: number): number => (kcal * KJ_PER_KCAL) / 1000;
/** MJ → kcal (× 1,000 / 4.184). */
export const mjToKcal = (mj: number): number => (mj * 1000) / KJ_PER_KCAL;

/** Factor to grams per kg for each mass unit, to kcal for each energy unit. */
const MASS_IN_G_PER_KG: Partial<Record<NutrientUnit, number>> = { '%': 10, 'g/kg': 1, 'mg/kg': 0.001 };
const ENERGY_IN_KCAL_PER_KG: Partial<Record<NutrientUnit, number>> = { 'kcal/kg': 1, 'MJ/kg': 1000 / KJ_PER_KCAL };

/** True when a value in `from` can be expressed in `to` (both mass or both energy, or the same unit). */
export function canConvert(from: NutrientUnit, to: NutrientUnit): boolean {
  if (from === to) return true;
  return (from in MASS_IN_G_PER_KG && to in MASS_IN_G_PER_KG) || (from in ENERGY_IN_KCAL_PER_KG && to in ENERGY_IN_KCAL_PER_KG);
}

/**
 * Converts a per-kg value between units of the same kind (%, g/kg, mg/kg; kcal/kg, MJ/kg).
 * IU/kg converts only to itself.
 * @throws RangeError when the units measure different things (e.g. % to kcal/kg)
 */
export function convertUnit(value: number, from: NutrientUnit, to: NutrientUnit): number {
  if (from === to) return value;
  const massFrom = MASS_IN_G_PER_KG[from];
  const massTo = MASS_IN_G_PER_KG[to];
  if (massFrom !== undefined && massTo !== undefined) return (value * massFrom) / massTo;
  const energyFrom = ENERGY_IN_KCAL_PER_KG[from];
  const energyTo = ENERGY_IN_KCAL_PER_KG[to];
  if (energyFrom !== undefined && energyTo !== undefined) return (value * energyFrom) / energyTo;
  throw new RangeError(`cannot convert ${from} to ${to}: they measure different things`);
}

/**
 * A daily allowance (mg per animal per day) → % of the diet at a feed intake, as layer requirements
 * are given: % = mg/d ÷ intake (g/d) ÷ 10.
 * @param mgPerDay mg per animal per day
 * @param intakeGPerDay feed eaten, g per animal per day (> 0)
 */
export function dailyMgToPercent(mgPerDay: number, intakeGPerDay: number): number {
  if (!(intakeGPerDay > 0)) throw new RangeError(`feed intake must be above 0 g/d, got ${intakeGPerDay}`);
  return mgPerDay / intakeGPerDay / 10;
}

/** % of the diet → mg per animal per day at a feed intake: mg/d = % × intake (g/d) × 10. */
export function percentToDailyMg(percent: number, intakeGPerDay: number): number {
  if (!(intakeGPerDay > 0)) throw new RangeError(`feed intake must be above 0 g/d, got ${intakeGPerDay}`);
  return percent * intakeGPerDay * 10;
}

/** The basis a composition table is shown on. */
export type CompositionBasis = 'as_fed' | 'dry_matter';

/**
 * A stored as-fed value shown on `basis`. The dry matter itself is 100 % of the dry matter.
 * @param nutrientId the catalogue id (`dm` is the dry matter)
 */
export function valueOnBasis(value: number, dryMatterPct: number, basis: CompositionBasis, nutrientId?: string): number {
  if (basis === 'as_fed') return value;
  if (nutrientId === 'dm') return 100;
  return asFedToDryMatter(value, dryMatterPct);
}
