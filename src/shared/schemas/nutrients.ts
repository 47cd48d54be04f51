import { z } from 'zod';

import { NUTRIENT_GROUPS, SPECIES_FAMILIES, type AminoAcidBasis, type NutrientGroup, type NutrientUnit, type SpeciesFamily } from '../library-terms';
import { pageQuery } from './library-common';

/** GET /api/nutrients query. */
export const listNutrientsQuery = z.object({
  ...pageQuery,
  pageSize: pageQuery.pageSize.default(200),
  family: z.enum(SPECIES_FAMILIES).optional(),
  group: z.enum(NUTRIENT_GROUPS).optional(),
});
export type ListNutrientsQuery = z.infer<typeof listNutrientsQuery>;

/** A nutrient of the catalogue. Values everywhere are per kg as fed in `unit`. */
export type Nutrient = {
  id: string;
  name: string;
  unit: NutrientUnit;
  group: NutrientGroup;
  families: SpeciesFamily[];
  basis: AminoAcidBasis | null;
  sortOrder: number;
  description: string | null;
};
