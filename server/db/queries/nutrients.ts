import { and, asc, count, like, sql, type SQL } from 'drizzle-orm';
import type { z } from 'zod';

import type { Page } from '../../../src/shared/schemas/library-common';
import type { listNutrientsQuery, Nutrient } from '../../../src/shared/schemas/nutrients';
import type { Db } from '../client';
import { nutrients } from '../schema';
import { likePattern } from './library-shared';

export async function listNutrients(db: Db, q: z.output<typeof listNutrientsQuery>): Promise<Page<Nutrient>> {
  const where: SQL[] = [];
  if (q.family) where.push(sql`JSON_CONTAINS(${nutrients.families}, ${JSON.stringify(q.family)})`);
  if (q.group) where.push(sql`${nutrients.nutrientGroup} = ${q.group}`);
  if (q.search) where.push(like(nutrients.name, likePattern(q.search)));
  const filter = where.length ? and(...where) : undefined;
  const [{ total }] = await db.select({ total: count() }).from(nutrients).where(filter);
  const rows = await db.select().from(nutrients).where(filter).orderBy(asc(nutrients.sortOrder)).limit(q.pageSize).offset((q.page - 1) * q.pageSize);
  return {
    items: rows.map((n) => ({ id: n.id, name: n.name, unit: n.unit, group: n.nutrientGroup, families: n.families, basis: n.basis, sortOrder: n.sortOrder, description: n.description })),
    total,
    page: q.page,
    pageSize: q.pageSize,
  };
}
