/**
 * "Check my ration": what a farmer actually mixes, judged against a requirement, in plain words, and the
 * cheapest correction from the ingredients they have.
 *
 * Units: amounts in kg, prices currency per kg, nutrient values and bounds per kg as fed in each
 * nutrient's catalogue unit (%, kcal/kg…). Words use the organization's mass unit and currency.
 * Pure: the server and the phone run the same code through the engine.
 */
import { evaluateMix, solveFormula } from './engine';
import { formatLevel, formatMoney, massFromKg, massUnit, pricePerMassUnit, type UnitSystem } from './measures';
import type { EvaluationResult, FormulaProblemInput, FormulaResult } from './schemas/formulation';

/** One ingredient the farmer mixes. `key` is unique in the ration. */
export type RationLine = {
  key: string;
  name: string;
  /** Amount in the batch they mix, kg as fed. */
  kg: number;
  /** Currency per kg; null when unknown (the cost and the correction then say so). */
  pricePerKg: number | null;
  /** Nutrient id → value per kg as fed; a nutrient absent here counts as 0 and is named in the finding. */
  values: Record<string, number>;
  /** The insect-protein rule's verdict for this diet's species; a refused meal is called out and the correction leaves it out. */
  refused?: string | null;
};

export type RequirementBound = { nutrientId: string; name: string; unit: string; min: number | null; max: number | null };
export type RequirementRatio = { numeratorId: string; denominatorId: string; name: string; min: number | null; max: number | null };
export type Requirement = { name: string; source: string; bounds: RequirementBound[]; ratios: RequirementRatio[] };

export type FindingKind = 'short' | 'excess' | 'ok' | 'unknown' | 'refused';

export type Finding = {
  kind: FindingKind;
  /** Nutrient id, `numerator:denominator` for a ratio, or the line key for a refused ingredient. */
  id: string;
  name: string;
  unit: string;
  value: number | null;
  min: number | null;
  max: number | null;
  /** How far below the minimum or above the maximum (positive), else 0. */
  by: number;
  /** Ingredients with no value for this nutrient (counted as 0). */
  missingIn: string[];
  text: string;
};

export type CorrectionLine = { key: string; name: string; currentKg: number; newKg: number; changeKg: number };

export type Correction =
  | { mode: CorrectionMode; status: 'found'; batchKg: number; costPerKg: number; lines: CorrectionLine[]; text: string[] }
  | { mode: CorrectionMode; status: 'none'; text: string[] };

/** `add`: keep every kg already mixed and add only from the same ingredients; `rebalance`: the same total, other proportions. */
export type CorrectionMode = 'add' | 'rebalance';

export type RationCheckResult = {
  totalKg: number;
  /** Null when some price is unknown. */
  costPerKg: number | null;
  unpricedLines: string[];
  meetsRequirement: boolean;
  findings: Finding[];
  /** The plain-words summary, one sentence a line. */
  summary: string[];
  corrections: Correction[];
};

export type RationCheckOptions = {
  system?: UnitSystem;
  currency?: string;
  /** How much may be added in `add` mode, % of what is mixed now (default 40). */
  maxAddPercent?: number;
  /** Relative slack below which a level counts as meeting its bound (default 1e-6). */
  tolerance?: number;
};

/** A level with as many decimals as its size needs (3,050 kcal/kg; 18.2 %; 1.07 %; 0.085 %). */
export const level = formatLevel;

const withUnit = (v: number, unit: string) => (unit ? `${level(v)} ${unit}` : level(v));

/** The engine problem of the ration as mixed (ids are the line keys). */
export function rationProblem(lines: readonly RationLine[], requirement: Requirement): FormulaProblemInput {
  const wanted = new Set([...requirement.bounds.map((b) => b.nutrientId), ...requirement.ratios.flatMap((r) => [r.numeratorId, r.denominatorId])]);
  const bounded = new Set(requirement.bounds.map((b) => b.nutrientId));
  return {
    batchKg: lines.reduce((s, l) => s + l.kg, 0),
    ingredients: lines.map((l) => ({
      id: l.key,
      name: l.name,
      pricePerKg: l.pricePerKg ?? 0,
      nutrients: Object.fromEntries(Object.entries(l.values).filter(([id]) => wanted.has(id))),
    })),
    nutrients: [
      ...requirement.bounds.map((b) => ({ id: b.nutrientId, name: b.name, unit: b.unit, ...(b.min != null ? { min: b.min } : {}), ...(b.max != null ? { max: b.max } : {}) })),
      ...[...wanted].filter((id) => !bounded.has(id)).map((id) => ({ id, name: id })),
    ],
    ratios: requirement.ratios.map((r) => ({ name: r.name, numerator: r.numeratorId, denominator: r.denominatorId, ...(r.min != null ? { min: r.min } : {}), ...(r.max != null ? { max: r.max } : {}) })),
    options: { sensitivity: false },
  };
}

/** Judges the ration as mixed and looks for the cheapest correction. */
export function checkRation(lines: readonly RationLine[], requirement: Requirement, options: RationCheckOptions = {}): RationCheckResult {
  const system = options.system ?? 'metric';
  const currency = options.currency ?? '';
  const tol = options.tolerance ?? 1e-6;
  const unit = massUnit(system);
  const problem = rationProblem(lines, requirement);
  const { options: _solveOptions, ...plain } = problem;
  const evaluated = evaluateMix({ ...plain, mix: lines.map((l) => ({ id: l.key, kg: l.kg })) });
  if (evaluated.status !== 'evaluated') throw new RangeError(`the ration could not be evaluated: ${evaluated.message}`);
  const ev = evaluated as EvaluationResult;
  const totalKg = ev.totalKg;
  const unpricedLines = lines.filter((l) => l.pricePerKg == null).map((l) => l.name);
  const costPerKg = unpricedLines.length ? null : ev.costPerKg;

  const findings: Finding[] = [];
  for (const l of lines) {
    if (l.refused) findings.push({ kind: 'refused', id: l.key, name: l.name, unit: '', value: null, min: null, max: null, by: 0, missingIn: [], text: `${l.name} must not be fed to this animal: ${l.refused}` });
  }
  for (const b of requirement.bounds) {
    const report = ev.nutrients.find((n) => n.id === b.nutrientId);
    const value = report?.value ?? 0;
    const missingIn = lines.filter((l) => l.kg > 0 && l.values[b.nutrientId] === undefined).map((l) => l.name);
    const base = { id: b.nutrientId, name: b.name, unit: b.unit, value, min: b.min, max: b.max, missingIn };
    const note = missingIn.length ? ` (${missingIn.join(', ')} ${missingIn.length === 1 ? 'has' : 'have'} no value for it, counted as 0)` : '';
    if (missingIn.length === lines.filter((l) => l.kg > 0).length) {
      findings.push({ ...base, kind: 'unknown', value: null, by: 0, text: `${b.name}: none of your ingredients has a value for it, so it cannot be checked.` });
    } else if (b.min != null && value < b.min - tol * Math.max(1, Math.abs(b.min))) {
      findings.push({ ...base, kind: 'short', by: b.min - value, text: `${b.name} is short: ${withUnit(value, b.unit)} in your mix, at least ${withUnit(b.min, b.unit)} needed (short by ${withUnit(b.min - value, b.unit)})${note}.` });
    } else if (b.max != null && value > b.max + tol * Math.max(1, Math.abs(b.max))) {
      findings.push({ ...base, kind: 'excess', by: value - b.max, text: `${b.name} is too high: ${withUnit(value, b.unit)} in your mix, at most ${withUnit(b.max, b.unit)} wanted (over by ${withUnit(value - b.max, b.unit)})${note}.` });
    } else {
      findings.push({ ...base, kind: 'ok', by: 0, text: `${b.name} is within the requirement: ${withUnit(value, b.unit)}${note}.` });
    }
  }
  requirement.ratios.forEach((r, k) => {
    const report = ev.ratios[k];
    const value = report?.value ?? null;
    const id = `${r.numeratorId}:${r.denominatorId}`;
    const base = { id, name: r.name, unit: '', value, min: r.min, max: r.max, missingIn: [] as string[] };
    if (value === null) findings.push({ ...base, kind: 'unknown', by: 0, text: `${r.name}: cannot be worked out (the second nutrient is 0 in your mix).` });
    else if (r.min != null && value < r.min - tol) findings.push({ ...base, kind: 'short', by: r.min - value, text: `${r.name} is too low: ${level(value)}, at least ${level(r.min)} needed.` });
    else if (r.max != null && value > r.max + tol) findings.push({ ...base, kind: 'excess', by: value - r.max, text: `${r.name} is too high: ${level(value)}, at most ${level(r.max)} wanted.` });
    else findings.push({ ...base, kind: 'ok', by: 0, text: `${r.name} is within the requirement: ${level(value)}.` });
  });

  const problems = findings.filter((f) => f.kind === 'short' || f.kind === 'excess' || f.kind === 'refused');
  const summary: string[] = [];
  summary.push(`Your mix weighs ${level(massFromKg(totalKg, system))} ${unit}, checked against ${requirement.name} (${requirement.source}).`);
  summary.push(
    problems.length === 0
      ? 'Nothing is short or in excess among the nutrients this requirement names.'
      : `${problems.length} ${problems.length === 1 ? 'thing needs' : 'things need'} attention: ${problems.map((f) => `${f.name} ${f.kind === 'short' ? 'short' : f.kind === 'excess' ? 'too high' : 'not allowed'}`).join('; ')}.`,
  );
  summary.push(
    costPerKg === null
      ? `Cost per ${unit}: unknown until you enter a price for ${unpricedLines.join(', ')}.`
      : `It costs ${formatMoney(pricePerMassUnit(costPerKg, system), currency)} per ${unit}.`,
  );

  const corrections = problems.length === 0 ? [] : (['add', 'rebalance'] as const).map((mode) => correct(lines, requirement, mode, { ...options, system, currency }));
  return { totalKg, costPerKg, unpricedLines, meetsRequirement: problems.length === 0, findings, summary, corrections };
}

/**
 * The cheapest correction from the farmer's own ingredients. `add` keeps every kg already mixed as a
 * minimum and tries batches up to `maxAddPercent` larger, keeping the lowest cost per kg (within 0.01 %: the
 * smaller batch); `rebalance` keeps the total and lets the proportions change. A refused insect meal is
 * held at 0 in both. Ingredients without a price cannot be weighed against each other: no correction.
 */
export function correct(lines: readonly RationLine[], requirement: Requirement, mode: CorrectionMode, options: RationCheckOptions = {}): Correction {
  const system = options.system ?? 'metric';
  const unit = massUnit(system);
  const unpriced = lines.filter((l) => l.pricePerKg == null).map((l) => l.name);
  if (unpriced.length) return { mode, status: 'none', text: [`Enter a price for ${unpriced.join(', ')} to get the cheapest correction.`] };
  const base = rationProblem(lines, requirement);
  const kept = lines.filter((l) => !l.refused);
  const keptKg = kept.reduce((s, l) => s + l.kg, 0);
  const total = lines.reduce((s, l) => s + l.kg, 0);
  const build = (batchKg: number, diagnose: boolean): FormulaProblemInput => ({
    ...base,
    batchKg,
    ingredients: base.ingredients.map((ing, k) => {
      const line = lines[k];
      if (line.refused) return { ...ing, fixedKg: 0 };
      return mode === 'add' ? { ...ing, minKg: line.kg } : ing;
    }),
    options: { sensitivity: false, diagnose },
  });

  let best: Extract<FormulaResult, { status: 'optimal' }> | null = null;
  let last: FormulaResult | null = null;
  const batches = mode === 'add' ? Array.from({ length: 21 }, (_, i) => Math.max(keptKg, total) * (1 + ((options.maxAddPercent ?? 40) / 100) * (i / 20))) : [total];
  for (const batchKg of batches) {
    const r = solveFormula(build(batchKg, false));
    last = r;
    if (r.status === 'optimal' && (!best || r.costPerKg < best.costPerKg * (1 - 1e-4))) best = r;
  }
  if (!best) {
    const diagnosed = solveFormula(build(batches[batches.length - 1], true));
    const why = diagnosed.status === 'infeasible' ? diagnosed.message : last && 'message' in last ? last.message : 'no mix was found';
    const lead = mode === 'add'
      ? `Adding up to ${options.maxAddPercent ?? 40} % more from your own ingredients cannot fix it: ${why}.`
      : `Changing the proportions of your own ingredients cannot fix it: ${why}.`;
    return { mode, status: 'none', text: [lead, 'You need another ingredient (for example a protein meal, a mineral or a premix) or advice from your nutritionist.'] };
  }
  const found = best;
  const out: CorrectionLine[] = lines.map((l) => {
    const newKg = found.mix.find((m) => m.id === l.key)?.kg ?? 0;
    return { key: l.key, name: l.name, currentKg: l.kg, newKg, changeKg: newKg - l.kg };
  });
  const fmtMass = (kg: number) => `${level(massFromKg(Math.abs(kg), system))} ${unit}`;
  const steps = out.filter((l) => Math.abs(l.changeKg) > 1e-6 * Math.max(1, total)).map((l) => (l.changeKg > 0 ? `add ${fmtMass(l.changeKg)} of ${l.name}` : `use ${fmtMass(l.changeKg)} less ${l.name}`));
  const text = [
    mode === 'add' ? `Cheapest fix keeping everything you mix now: ${steps.join(', ')}.` : `Cheapest fix with the same ${fmtMass(total)} of feed: ${steps.join(', ')}.`,
    `The corrected mix weighs ${fmtMass(found.batchKg)} and costs ${formatMoney(pricePerMassUnit(found.costPerKg, system), options.currency ?? '')} per ${unit}.`,
  ];
  return { mode, status: 'found', batchKg: found.batchKg, costPerKg: found.costPerKg, lines: out, text };
}
