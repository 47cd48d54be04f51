/**
 * Contracts of /api/shares: an advisor or nutritionist sends a formula result or a ration check to a
 * farm. The farm's members get an e-mail with a link to a read-only copy (and the result as CSV).
 */
import { z } from 'zod';

import type { Measures } from '../measures';
import type { RationCheckResponse } from './ration-checks';
import { rationCheckInput } from './ration-checks';
import type { VersionSnapshot, VersionSummary } from './formulas';

const common = {
  toOrganizationId: z.number({ message: 'choose the farm to share with' }).int().positive(),
  note: z.string().trim().max(1000, 'at most 1,000 characters').nullish(),
};

/** POST /api/shares. */
export const createShareInput = z.discriminatedUnion('kind', [
  z.strictObject({ kind: z.literal('formula_version'), formulaId: z.number().int().positive(), versionId: z.number().int().positive(), ...common }),
  z.strictObject({ kind: z.literal('ration_check'), check: rationCheckInput, ...common }),
], { message: 'choose what to share: a formula version or a ration check' });
export type CreateShareInput = z.input<typeof createShareInput>;

export const shareTokenParams = z.object({ token: z.string().regex(/^[A-Za-z0-9_-]{16,40}$/, 'not a share link') });

/** What a share keeps: a read-only copy, unchanged when the formula or library changes later. */
export type SharedPayload =
  | { kind: 'formula_version'; formulaName: string; version: VersionSummary; snapshot: VersionSnapshot; measures: Measures }
  | { kind: 'ration_check'; check: RationCheckResponse };

export type ShareSummary = {
  token: string;
  kind: 'formula_version' | 'ration_check';
  title: string;
  note: string | null;
  fromOrganization: string;
  toOrganization: string;
  sharedBy: string;
  sharedAt: string;
};

export type ShareDetail = ShareSummary & { payload: SharedPayload; measures: Measures };

/** The answer of POST /api/shares. */
export type ShareCreated = ShareSummary & { recipients: string[]; link: string };

/** GET /api/shares/targets: the farms the caller belongs to, to share with. */
export type ShareTarget = { id: number; name: string; role: string };
