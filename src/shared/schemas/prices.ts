import { z } from 'zod';

import { isoDate, pageQuery } from './library-common';

/** POST /api/prices: many prices at once, all on one date; all are saved or none. */
export const recordPricesInput = z.strictObject({
  effectiveOn: isoDate,
  items: z
    .array(
      z.strictObject({
        ingredientId: z.number().int().positive(),
        pricePerKg: z.number({ message: 'enter a price' }).min(0, 'a price cannot be negative').max(1_000_000, 'price per kg looks too large'),
      }),
    )
    .min(1, 'enter at least one price')
    .max(1000, 'at most 1,000 prices at once'),
});
export type RecordPricesInput = z.input<typeof recordPricesInput>;

export const listPricesQuery = z.object({ ...pageQuery, ingredientId: z.coerce.number().int().positive({ message: 'choose an ingredient' }) });

export type RecordPricesResult = { saved: number; effectiveOn: string };
