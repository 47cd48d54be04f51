/**
 * Demo supply plan for the invented larvae farm: the brewery grains and vegetable waste it rears its larvae
 * on, linked to its own larvae meal (with its lab analysis) in the library. Tonnages are invented.
 */
import { and, eq } from 'drizzle-orm';

import type { Db } from '../client';
import { ingredients, organizations, supplyPlans, supplyStreams } from '../schema';

export async function seedDemoSupplyPlans(tx: Db): Promise<void> {
  const [farm] = await tx.select({ id: organizations.id }).from(organizations).where(eq(organizations.name, 'Orrin Hollow Larvae Farm'));
  if (!farm) return;
  const [meal] = await tx
    .select({ id: ingredients.id })
    .from(ingredients)
    .where(and(eq(ingredients.organizationId, farm.id), eq(ingredients.name, 'Orrin Hollow larvae meal, full-fat (brewery grains and vegetable waste)')));
  const [{ id }] = await tx
    .insert(supplyPlans)
    .values({
      organizationId: farm.id,
      name: 'Orrin Hollow weekly rearing',
      notes: 'Spent grains collected Mondays and Thursdays; vegetable trimmings from the Wend Valley market every weekday.',
      defatted: false,
      mealIngredientId: meal?.id ?? null,
    })
    .$returningId();
  await tx.insert(supplyStreams).values([
    { planId: id, position: 0, name: 'Spent grains from the town brewery', substrate: 'brewery_grains', tonnesPerWeek: 6 },
    { planId: id, position: 1, name: 'Market vegetable and fruit trimmings', substrate: 'fruit_vegetable_waste', tonnesPerWeek: 4, moisturePct: 90 },
  ]);
}
