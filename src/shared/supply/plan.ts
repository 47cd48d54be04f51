/**
 * The weekly supply plan: from by-product streams to fresh larvae, rearing residue (frass) and dried meal,
 * with a mass balance of water, dry matter and protein, the meal's estimated composition and an optional
 * defatting step that splits the dried larvae into meal and oil.
 *
 * Units: masses in kg per week; composition in % (of dry matter where the name says `Dm`, as fed otherwise).
 *
 * Assumptions, said once:
 * - Each stream is reared on its own; the meal is the sum of what every stream gives, so its composition is
 *   the streams' larval compositions weighted by the larval dry matter each stream gives.
 * - Dry matter fed that ends neither in larvae nor in residue is respired (CO₂ and metabolic water).
 * - Protein fed that is not in the larvae stays in the residue or is lost as ammonia; the plan does not
 *   estimate the split.
 * - Drying removes water only. Pressing removes fat only (the oil is counted as pure fat); protein, ash and
 *   minerals stay in the pressed meal.
 * Pure: no framework imports.
 */
import {
  DEFAULT_MEAL_DRY_MATTER_PCT,
  DEFAULT_RESIDUAL_FAT_PCT,
  DEFAULT_RESIDUE_MOISTURE_PCT,
  LARVAE_NUTRIENTS,
  SUBSTRATES,
  defaultYields,
  type LarvaeNutrient,
  type SubstrateKind,
  type YieldFactors,
} from './substrates';
import type { Confidence, OriginAnimal } from '../library-terms';

/** One by-product stream as the user enters it. */
export type SupplyStreamInput = {
  /** A name the user recognises ("Brewery grains from the town brewery"). */
  name: string;
  substrate: SubstrateKind;
  /** Fresh (as delivered) substrate, tonnes per week. */
  tonnesPerWeek: number;
  /** Water in the substrate as delivered, %. Default: the substrate's. */
  moisturePct?: number | null;
  /** Crude protein of the substrate, % of its dry matter. Default: the substrate's. */
  substrateCpDmPct?: number | null;
  /** Yield factors that override the substrate's defaults; missing ones keep the default. */
  yields?: Partial<YieldFactors> | null;
  /** For animal-origin or mixed substrates: the animals it came from. Default: the substrate's. */
  animals?: OriginAnimal[] | null;
};

/** A lab analysis of the dried full-fat meal, as fed; it replaces the estimate for every value it gives. */
export type MealLabAnalysis = {
  /** Laboratory and report, or the library entry it came from. */
  source: string;
  dryMatterPct: number;
  values: Partial<Record<LarvaeNutrient, number>>;
};

export type SupplyPlanOptions = {
  /** Dry matter of the dried meal, % (default 92). */
  mealDryMatterPct?: number;
  /** Water in the residue as taken off, % (default 30). */
  residueMoisturePct?: number;
  /** Press the dried larvae into a meal and oil. */
  defatted?: boolean;
  /** Fat left in the pressed meal, % as fed (default 14.4). */
  residualFatPct?: number;
  labAnalysis?: MealLabAnalysis | null;
};

export type StreamBalance = {
  index: number;
  name: string;
  substrate: SubstrateKind;
  /** The factors used, and which of them the user set. */
  factors: YieldFactors & { moisturePct: number; substrateCpDmPct: number; overridden: string[] };
  animals: OriginAnimal[];
  fed: { freshKg: number; waterKg: number; dryMatterKg: number; proteinKg: number };
  larvae: { freshKg: number; waterKg: number; dryMatterKg: number; proteinKg: number };
  residue: { dryMatterKg: number; waterKg: number; asTakenOffKg: number };
  /** Dry matter respired during rearing, kg. */
  respiredDryMatterKg: number;
  /** Water that left the rearing as vapour or leachate, kg. */
  waterLostKg: number;
  /** Protein fed not found in the larvae (in the residue or lost as ammonia), kg. */
  proteinNotInLarvaeKg: number;
};

/** One estimated composition line of the meal. */
export type CompositionLine = {
  id: LarvaeNutrient;
  /** % of the meal's dry matter. */
  dmPct: number;
  /** % of the meal as fed. */
  asFedPct: number;
  /** `lab` when a lab analysis gave it; otherwise estimated from the substrates. */
  origin: 'lab' | 'estimate';
  /** Sources of the estimate (one per substrate used) or the lab report. */
  sources: { text: string; confidence: Confidence }[];
};

export type SupplyPlanResult = {
  streams: StreamBalance[];
  totals: {
    substrateFreshKg: number;
    substrateWaterKg: number;
    substrateDryMatterKg: number;
    substrateProteinKg: number;
    larvaeFreshKg: number;
    larvaeWaterKg: number;
    larvaeDryMatterKg: number;
    larvaeProteinKg: number;
    residueDryMatterKg: number;
    residueWaterKg: number;
    residueAsTakenOffKg: number;
    respiredDryMatterKg: number;
    waterLostKg: number;
    proteinNotInLarvaeKg: number;
  };
  /** Drying (and pressing, when defatted): from fresh larvae to what leaves the farm. */
  processing: {
    /** Dried full-fat larvae, kg as fed. */
    driedLarvaeKg: number;
    /** Water removed by the drier, kg. */
    dryingWaterKg: number;
    defatted: boolean;
    /** The meal that goes into feed, kg as fed (pressed meal when defatted). */
    mealKg: number;
    mealDryMatterPct: number;
    mealProteinKg: number;
    /** Oil pressed out, kg (0 unless defatted). */
    oilKg: number;
  };
  /** Composition of the full-fat dried larvae, before any pressing. */
  fullFatComposition: CompositionLine[];
  /** Composition of the meal that goes into feed. */
  mealComposition: CompositionLine[];
  warnings: string[];
};

const round = (x: number, digits = 6) => Math.round(x * 10 ** digits) / 10 ** digits;

/** The factors a stream uses: the user's where given, otherwise the substrate's defaults. */
export function streamFactors(stream: SupplyStreamInput): StreamBalance['factors'] {
  const d = SUBSTRATES[stream.substrate];
  const overridden: string[] = [];
  const pick = (key: string, given: number | null | undefined, fallback: number) => {
    if (given === null || given === undefined) return fallback;
    overridden.push(key);
    return given;
  };
  const defaults = defaultYields(stream.substrate);
  return {
    moisturePct: pick('moisturePct', stream.moisturePct, d.moisturePct.value),
    substrateCpDmPct: pick('substrateCpDmPct', stream.substrateCpDmPct, d.substrateCpDmPct.value),
    bioconversionDmPct: pick('bioconversionDmPct', stream.yields?.bioconversionDmPct, defaults.bioconversionDmPct),
    residueDmPct: pick('residueDmPct', stream.yields?.residueDmPct, defaults.residueDmPct),
    larvaeDryMatterPct: pick('larvaeDryMatterPct', stream.yields?.larvaeDryMatterPct, defaults.larvaeDryMatterPct),
    overridden,
  };
}

function balanceStream(stream: SupplyStreamInput, index: number, residueMoisturePct: number, warnings: string[]): StreamBalance {
  const f = streamFactors(stream);
  const freshKg = stream.tonnesPerWeek * 1000;
  const waterKg = (freshKg * f.moisturePct) / 100;
  const dryMatterKg = freshKg - waterKg;
  const proteinKg = (dryMatterKg * f.substrateCpDmPct) / 100;
  const larvaeDm = (dryMatterKg * f.bioconversionDmPct) / 100;
  const larvaeFresh = f.larvaeDryMatterPct > 0 ? (larvaeDm * 100) / f.larvaeDryMatterPct : 0;
  const cpDm = SUBSTRATES[stream.substrate].larvae.cp.value;
  const larvaeProtein = (larvaeDm * cpDm) / 100;
  const residueDm = (dryMatterKg * f.residueDmPct) / 100;
  const residueAsTakenOff = residueMoisturePct < 100 ? (residueDm * 100) / (100 - residueMoisturePct) : residueDm;
  const residueWater = residueAsTakenOff - residueDm;
  const respired = dryMatterKg - larvaeDm - residueDm;
  const waterLost = waterKg - (larvaeFresh - larvaeDm) - residueWater;
  const label = `${stream.name || SUBSTRATES[stream.substrate].label}`;
  if (respired < -1e-9) warnings.push(`${label}: larvae and residue together hold more dry matter than the substrate gives. Lower the bioconversion or the residue factor.`);
  if (larvaeProtein - proteinKg > 1e-9) warnings.push(`${label}: the larvae would hold more protein than the substrate gives. Check the substrate’s protein and the bioconversion factor.`);
  if (waterLost < -1e-9) warnings.push(`${label}: larvae and residue hold more water than the substrate brings; the substrate must be wetted, or the factors are off.`);
  return {
    index,
    name: stream.name,
    substrate: stream.substrate,
    factors: f,
    animals: [...(stream.animals ?? SUBSTRATES[stream.substrate].defaultAnimals)],
    fed: { freshKg, waterKg, dryMatterKg, proteinKg },
    larvae: { freshKg: larvaeFresh, waterKg: larvaeFresh - larvaeDm, dryMatterKg: larvaeDm, proteinKg: larvaeProtein },
    residue: { dryMatterKg: residueDm, waterKg: residueWater, asTakenOffKg: residueAsTakenOff },
    respiredDryMatterKg: respired,
    waterLostKg: waterLost,
    proteinNotInLarvaeKg: proteinKg - larvaeProtein,
  };
}

/**
 * The larval dry-matter composition of the mix of streams: each stream's larval composition weighted by
 * the larval dry matter it gives, in % of DM; a lab analysis replaces every value it gives.
 */
export function larvaeComposition(streams: StreamBalance[], lab?: MealLabAnalysis | null): CompositionLine[] {
  const totalDm = streams.reduce((s, b) => s + b.larvae.dryMatterKg, 0);
  return LARVAE_NUTRIENTS.map((id) => {
    const labValue = lab?.values[id];
    if (lab && labValue !== undefined && labValue !== null) {
      const dmPct = (labValue * 100) / lab.dryMatterPct;
      return { id, dmPct, asFedPct: labValue, origin: 'lab' as const, sources: [{ text: lab.source, confidence: 'verified' as const }] };
    }
    const used = streams.filter((b) => b.larvae.dryMatterKg > 0);
    const dmPct = totalDm > 0 ? used.reduce((s, b) => s + b.larvae.dryMatterKg * SUBSTRATES[b.substrate].larvae[id].value, 0) / totalDm : 0;
    const seen = new Set<string>();
    const sources = used.flatMap((b) => {
      const src = SUBSTRATES[b.substrate].larvae[id];
      if (seen.has(src.source)) return [];
      seen.add(src.source);
      return [{ text: src.source, confidence: src.confidence }];
    });
    return { id, dmPct, asFedPct: dmPct, origin: 'estimate' as const, sources };
  });
}

/**
 * Splits dried larvae into a pressed meal and oil.
 * @param dryMatterKg larval dry matter, kg
 * @param fatDmPct fat in that dry matter, %
 * @param mealDryMatterPct dry matter of the pressed meal, %
 * @param residualFatPct fat left in the pressed meal, % as fed
 * @returns the pressed meal (kg as fed) and the oil (kg); `pressed` false when the larvae hold no more fat
 *   than the meal would keep, in which case nothing is pressed out.
 */
export function defatSplit(dryMatterKg: number, fatDmPct: number, mealDryMatterPct: number, residualFatPct: number): { mealKg: number; oilKg: number; pressed: boolean } {
  const fatKg = (dryMatterKg * fatDmPct) / 100;
  const restKg = dryMatterKg - fatKg;
  const d = mealDryMatterPct / 100;
  const r = residualFatPct / 100;
  const fullFatMealKg = dryMatterKg / d;
  if (r >= d) return { mealKg: fullFatMealKg, oilKg: 0, pressed: false };
  const mealKg = restKg / (d - r);
  const oilKg = fatKg - r * mealKg;
  if (oilKg <= 0) return { mealKg: fullFatMealKg, oilKg: 0, pressed: false };
  return { mealKg, oilKg, pressed: true };
}

/**
 * Estimates a week's supply: the mass balance of every stream, drying, optional pressing, and the meal's
 * composition.
 */
export function planSupply(streams: SupplyStreamInput[], options: SupplyPlanOptions = {}): SupplyPlanResult {
  const warnings: string[] = [];
  const residueMoisturePct = options.residueMoisturePct ?? DEFAULT_RESIDUE_MOISTURE_PCT.value;
  const mealDryMatterPct = options.mealDryMatterPct ?? DEFAULT_MEAL_DRY_MATTER_PCT.value;
  const balances = streams.map((s, i) => balanceStream(s, i, residueMoisturePct, warnings));
  const sum = (pick: (b: StreamBalance) => number) => balances.reduce((s, b) => s + pick(b), 0);
  const totals = {
    substrateFreshKg: sum((b) => b.fed.freshKg),
    substrateWaterKg: sum((b) => b.fed.waterKg),
    substrateDryMatterKg: sum((b) => b.fed.dryMatterKg),
    substrateProteinKg: sum((b) => b.fed.proteinKg),
    larvaeFreshKg: sum((b) => b.larvae.freshKg),
    larvaeWaterKg: sum((b) => b.larvae.waterKg),
    larvaeDryMatterKg: sum((b) => b.larvae.dryMatterKg),
    larvaeProteinKg: sum((b) => b.larvae.proteinKg),
    residueDryMatterKg: sum((b) => b.residue.dryMatterKg),
    residueWaterKg: sum((b) => b.residue.waterKg),
    residueAsTakenOffKg: sum((b) => b.residue.asTakenOffKg),
    respiredDryMatterKg: sum((b) => b.respiredDryMatterKg),
    waterLostKg: sum((b) => b.waterLostKg),
    proteinNotInLarvaeKg: sum((b) => b.proteinNotInLarvaeKg),
  };

  const full = larvaeComposition(balances, options.labAnalysis).map((line) => ({ ...line, asFedPct: (line.dmPct * mealDryMatterPct) / 100 }));
  const dm = (id: LarvaeNutrient) => full.find((l) => l.id === id)!.dmPct;
  if (totals.larvaeDryMatterKg > 0 && dm('cp') + dm('ee') + dm('ash') > 100 + 1e-9) warnings.push(`Protein, fat and ash add up to ${round(dm('cp') + dm('ee') + dm('ash'), 1)} % of the dry matter, more than 100 %: check the composition factors or the lab values.`);
  if (totals.larvaeDryMatterKg > 0 && dm('ca') + dm('p') > dm('ash') + 1e-9) warnings.push('Calcium and phosphorus add up to more than the ash: check the composition factors or the lab values.');
  // With a lab analysis the protein in the larvae follows the measured value, not the estimate.
  const cpDm = full.find((l) => l.id === 'cp')!.dmPct;
  const larvaeProteinKg = (totals.larvaeDryMatterKg * cpDm) / 100;
  const driedLarvaeKg = totals.larvaeDryMatterKg > 0 ? (totals.larvaeDryMatterKg * 100) / mealDryMatterPct : 0;
  const dryingWaterKg = totals.larvaeFreshKg - driedLarvaeKg;
  if (dryingWaterKg < -1e-9) warnings.push('The meal is wetter than the fresh larvae: the meal dry matter must be above the larvae’s.');

  let mealKg = driedLarvaeKg;
  let oilKg = 0;
  let meal = full;
  const defatted = !!options.defatted;
  if (defatted && totals.larvaeDryMatterKg > 0) {
    const residualFatPct = options.residualFatPct ?? DEFAULT_RESIDUAL_FAT_PCT.value;
    const fatDmPct = full.find((l) => l.id === 'ee')!.dmPct;
    const split = defatSplit(totals.larvaeDryMatterKg, fatDmPct, mealDryMatterPct, residualFatPct);
    if (!split.pressed) warnings.push(`The larvae hold no more fat than ${round(residualFatPct, 1)} % as fed: pressing would give no oil, so the meal stays full-fat.`);
    mealKg = split.mealKg;
    oilKg = split.oilKg;
    meal = full.map((line) => {
      const componentKg = (totals.larvaeDryMatterKg * line.dmPct) / 100;
      const keptKg = line.id === 'ee' ? componentKg - oilKg : componentKg;
      const asFedPct = mealKg > 0 ? (keptKg * 100) / mealKg : 0;
      return { ...line, asFedPct, dmPct: (asFedPct * 100) / mealDryMatterPct };
    });
  }
  return {
    streams: balances,
    totals: { ...totals, larvaeProteinKg, proteinNotInLarvaeKg: totals.substrateProteinKg - larvaeProteinKg },
    processing: { driedLarvaeKg, dryingWaterKg, defatted: defatted && oilKg > 0, mealKg, mealDryMatterPct, mealProteinKg: larvaeProteinKg, oilKg },
    fullFatComposition: full,
    mealComposition: meal,
    warnings,
  };
}
