import { inArray } from 'drizzle-orm';

import type { NutrientUnit } from '../../../src/shared/library-terms';
import { badRequest, HttpError } from '../../http/errors';
import type { Db } from '../client';
import { nutrients } from '../schema';

/** The one answer to a write on a reference row. */
export const readOnlyReference = (what: string) =>
  new HttpError(403, 'read_only', `The reference library cannot be changed. Copy this ${what} into your own library, then edit the copy.`);

export const versionConflict = (what: string, version: number) =>
  new HttpError(409, 'version_conflict', `This ${what} was changed by someone else since you opened it (now version ${version}). Reload it; your edit was not saved.`);

/** Escapes LIKE wildcards so a search for "50%" finds the text "50%". */
export const likePattern = (search: string) => `%${search.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;

const LIMITS: Record<NutrientUnit, number> = { '%': 100, 'g/kg': 1000, 'mg/kg': 1_000_000, 'kcal/kg': 10_000, 'MJ/kg': 42, 'IU/kg': 100_000_000 };

/**
 * Checks nutrient ids against the catalogue and values against what their unit allows; throws 400 with
 * a field error per bad entry (path `values.<id>` by default).
 */
export async function checkNutrientValues(db: Db, values: Record<string, number | null | undefined>, path = 'values'): Promise<Map<string, NutrientUnit>> {
  const ids = Object.keys(values);
  const known = ids.length ? await db.select({ id: nutrients.id, unit: nutrients.unit, name: nutrients.name }).from(nutrients).where(inArray(nutrients.id, ids)) : [];
  const units = new Map(known.map((n) => [n.id, n.unit]));
  const fieldErrors: Record<string, string[]> = {};
  for (const [id, value] of Object.entries(values)) {
    const unit = units.get(id);
    if (!unit) fieldErrors[`${path}.${id}`] = [`“${id}” is not a nutrient in the catalogue`];
    else if (value != null && value > LIMITS[unit]) fieldErrors[`${path}.${id}`] = [`must be at most ${LIMITS[unit]} ${unit}`];
  }
  const first = Object.entries(fieldErrors)[0];
  if (first) throw badRequest(`${first[0]}: ${first[1][0]}`, fieldErrors);
  return units;
}

export const toNumber = (value: string | number | null | undefined): number | null => (value === null || value === undefined ? null : Number(value));

export const today = () => new Date().toISOString().slice(0, 10);
