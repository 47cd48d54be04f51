/**
 * Contracts of /api/organization-settings: how an organization reads amounts (metric kg and t, or US lb
 * and short tons) and money (an ISO 4217 currency code). Everything stays stored in kg and currency per
 * kg; only what people read and type is converted. The client imports only the types.
 */
import { z } from 'zod';

import { UNIT_SYSTEMS, type UnitSystem } from '../measures';

/** PUT /api/organization-settings. */
export const organizationSettingsInput = z.strictObject({
  unitSystem: z.enum(UNIT_SYSTEMS, { message: 'choose metric (kg, t) or US units (lb, short ton)' }),
  currency: z
    .string({ message: 'enter a currency code' })
    .trim()
    .transform((s) => s.toUpperCase())
    .pipe(z.string().regex(/^[A-Z]{3}$/, 'use a three-letter currency code such as EUR, USD or KES')),
});
export type OrganizationSettingsInput = z.input<typeof organizationSettingsInput>;

export type OrganizationSettings = { organizationId: number; unitSystem: UnitSystem; currency: string; updatedAt: string | null };
