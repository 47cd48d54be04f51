import { and, count, desc, eq, inArray } from 'drizzle-orm';
import type { z } from 'zod';

import type { Page } from '../../../src/shared/schemas/library-common';
import type { PricePoint } from '../../../src/shared/schemas/ingredients';
import type { recordPricesInput, RecordPricesResult } from '../../../src/shared/schemas/prices';
import { badRequest, notFound } from '../../http/errors';
import type { Db } from '../client';
import { ingredientPrices, ingredients, priceColumn } from '../schema';
import { findVisibleIngredient } from './ingredients';

/**
 * Saves many prices on one date, all or none. The current price of an ingredient moves only when the
 * new price is not older than the one it has, so a back-dated entry fills in the history only.
 */
export async function recordPrices(db: Db, organizationId: number, userId: string, input: z.output<typeof recordPricesInput>): Promise<RecordPricesResult> {
  const ids = input.items.map((i) => i.ingredientId);
  const duplicate = ids.find((id, i) => ids.indexOf(id) !== i);
  if (duplicate !== undefined) throw badRequest(`items: ingredient ${duplicate} appears twice; give one price per ingredient`, { items: [`ingredient ${duplicate} appears twice`] });
  await db.transaction(async (tx) => {
    const own = await tx.select({ id: ingredients.id, priceDate: ingredients.priceDate }).from(ingredients).where(and(inArray(ingredients.id, ids), eq(ingredients.organizationId, organizationId))).for('update');
    const found = new Map(own.map((r) => [r.id, r.priceDate]));
    const missing = ids.filter((id) => !found.has(id));
    if (missing.length) throw notFound('ingredient in your library', missing.join(', '));
    await tx.insert(ingredientPrices).values(input.items.map((i) => ({ ingredientId: i.ingredientId, pricePerKg: priceColumn(i.pricePerKg), effectiveOn: input.effectiveOn, recordedByUserId: userId })));
    for (const item of input.items) {
      const current = found.get(item.ingredientId);
      if (!current || current <= input.effectiveOn) {
        await tx.update(ingredients).set({ pricePerKg: priceColumn(item.pricePerKg), priceDate: input.effectiveOn }).where(eq(ingredients.id, item.ingredientId));
      }
    }
  });
  return { saved: input.items.length, effectiveOn: input.effectiveOn };
}

export async function listPrices(db: Db, organizationId: number, q: { ingredientId: number; page: number; pageSize: number }): Promise<Page<PricePoint>> {
  await findVisibleIngredient(db, organizationId, q.ingredientId);
  const where = eq(ingredientPrices.ingredientId, q.ingredientId);
  const [{ total }] = await db.select({ total: count() }).from(ingredientPrices).where(where);
  const rows = await db.select().from(ingredientPrices).where(where).orderBy(desc(ingredientPrices.effectiveOn), desc(ingredientPrices.id)).limit(q.pageSize).offset((q.page - 1) * q.pageSize);
  return { items: rows.map((p) => ({ id: p.id, pricePerKg: Number(p.pricePerKg), effectiveOn: p.effectiveOn, recordedAt: p.recordedAt.toISOString() })), total, page: q.page, pageSize: q.pageSize };
}
