import { eq } from 'drizzle-orm';
import type { z } from 'zod';

import { DEFAULT_MEASURES, type Measures } from '../../../src/shared/measures';
import type { OrganizationSettings, organizationSettingsInput } from '../../../src/shared/schemas/organization-settings';
import type { Db } from '../client';
import { organizationSettings } from '../schema';

/** How an organization reads amounts and money; metric and EUR until an owner changes it. */
export async function getMeasures(db: Db, organizationId: number): Promise<Measures> {
  const [row] = await db.select().from(organizationSettings).where(eq(organizationSettings.organizationId, organizationId));
  return row ? { unitSystem: row.unitSystem, currency: row.currency } : { ...DEFAULT_MEASURES };
}

export async function getOrganizationSettings(db: Db, organizationId: number): Promise<OrganizationSettings> {
  const [row] = await db.select().from(organizationSettings).where(eq(organizationSettings.organizationId, organizationId));
  if (!row) return { organizationId, ...DEFAULT_MEASURES, updatedAt: null };
  return { organizationId, unitSystem: row.unitSystem, currency: row.currency, updatedAt: row.updatedAt.toISOString() };
}

export async function saveOrganizationSettings(db: Db, organizationId: number, input: z.output<typeof organizationSettingsInput>): Promise<void> {
  await db
    .insert(organizationSettings)
    .values({ organizationId, unitSystem: input.unitSystem, currency: input.currency })
    .onDuplicateKeyUpdate({ set: { unitSystem: input.unitSystem, currency: input.currency } });
}
