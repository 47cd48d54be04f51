/**
 * Contracts of /api/ration-checks: what a farmer mixes (kg of each ingredient, from the library or typed
 * in with a few values), judged against a requirement specification. Amounts travel in kg and prices in
 * currency per kg (the phone converts from lb); the words come back in the organization's units.
 */
import { z } from 'zod';

import type { Measures } from '../measures';
import type { RationCheckResult } from '../ration-check';

const values = z.record(z.string().min(1).max(40), z.number({ message: 'must be a number' }).min(0, 'must not be negative').max(100_000, 'looks too large'));

/** One ingredient mixed: a library ingredient (`ingredientId`) or one typed in (`name` + `values`). */
export const rationLineInput = z
  .strictObject({
    ingredientId: z.number().int().positive().nullish(),
    name: z.string().trim().max(160).nullish(),
    kg: z.number({ message: 'enter the amount' }).min(0, 'must not be negative').max(1_000_000, 'at most 1,000,000 kg'),
    /** Currency per kg; for a library ingredient, absent means the library's price. */
    pricePerKg: z.number({ message: 'enter a price' }).min(0, 'a price cannot be negative').max(1_000_000).nullish(),
    /** Typed-in values per kg as fed in the catalogue unit (e.g. lys in %). For a library ingredient they replace the library's. */
    values: values.optional(),
  })
  .superRefine((l, ctx) => {
    if (!l.ingredientId && !l.name) ctx.addIssue({ code: 'custom', path: ['name'], message: 'name the ingredient or choose one from the library' });
    if (!l.ingredientId && (!l.values || Object.keys(l.values).length === 0)) ctx.addIssue({ code: 'custom', path: ['values'], message: 'give at least one nutrient value for a typed-in ingredient' });
  });

export const rationCheckInput = z
  .strictObject({
    specificationId: z.number({ message: 'choose the animal and phase' }).int().positive(),
    lines: z.array(rationLineInput).min(1, 'add at least one ingredient').max(40, 'at most 40 ingredients'),
    /** How much may be added when keeping what is mixed, % (default 40). */
    maxAddPercent: z.number().min(1).max(200).optional(),
  })
  .superRefine((v, ctx) => {
    if (v.lines.every((l) => l.kg === 0)) ctx.addIssue({ code: 'custom', path: ['lines'], message: 'the mix weighs 0 kg: enter the amounts you mix' });
    const seen = new Set<number>();
    v.lines.forEach((l, k) => {
      if (l.ingredientId && seen.has(l.ingredientId)) ctx.addIssue({ code: 'custom', path: ['lines', k, 'ingredientId'], message: 'this ingredient is listed twice: keep one line' });
      if (l.ingredientId) seen.add(l.ingredientId);
    });
  });
export type RationCheckInput = z.input<typeof rationCheckInput>;
export type RationLineInput = z.input<typeof rationLineInput>;

/** The answer of POST /api/ration-checks. */
export type RationCheckResponse = {
  requirement: { specificationId: number; name: string; source: string; species: string; phase: string | null };
  measures: Measures;
  /** The lines as checked, with names and the price used (currency per kg). */
  lines: { key: string; name: string; kg: number; pricePerKg: number | null; fromLibrary: boolean }[];
  result: RationCheckResult;
  checkedAt: string;
};

/** GET /api/ration-checks/choices: what the phone offers. */
export type RationChoices = {
  specifications: { id: number; name: string; source: string; species: string; phase: string | null; library: 'own' | 'reference' }[];
  ingredients: { id: number; name: string; category: string; pricePerKg: number | null; library: 'own' | 'reference' }[];
  /** Nutrients a typed-in ingredient may carry, in the catalogue unit. */
  nutrients: { id: string; name: string; unit: string }[];
};
