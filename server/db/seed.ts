import { eq } from 'drizzle-orm';

import type { Db } from './client';
import { seedDemoLibraries } from './reference-data/demo-library';
import { seedReferenceLibrary } from './reference-data/seed-library';
import { REFERENCE_PULLETS_STEP } from './reference-data/pullets';
import { REFERENCE_FIBRE_STEP } from './reference-data/fibre-fractions';
import { seedDemoShares } from './demo/shares';
import { seedDemoAccounts } from './demo/accounts';
import { seedDemoSupplyPlans } from './demo/supply';
import { seedDemoFormulas } from './demo/formulas';
import { organizations, seedRuns, type NewOrganizationRow } from './schema';

/**
 * Demo data: an invented scenario (a cooperative mill, a farm that rears its own larvae, an advisory office).
 * Each set is applied once, recorded in seed_runs, inside one transaction so a failed seed leaves nothing half-written.
 */
const DEMO_ORGANIZATIONS: NewOrganizationRow[] = [
  { name: 'Tamsby Cooperative Feed Mill', kind: 'feed_mill' },
  { name: 'Orrin Hollow Larvae Farm', kind: 'farm' },
  { name: 'Upper Wend Extension Office', kind: 'advisory' },
];

export type SeedStep = { name: string; apply: (tx: Db) => Promise<void> };

/** The read-only reference library (nutrients, ingredients, species, specifications); every database needs it. */
export const REFERENCE_LIBRARY_STEP: SeedStep = { name: 'reference-library-v1', apply: seedReferenceLibrary };

export const DEMO_SEED_STEPS: SeedStep[] = [
  REFERENCE_LIBRARY_STEP,
  REFERENCE_PULLETS_STEP,
  REFERENCE_FIBRE_STEP,
  { name: 'demo-organizations-v1', apply: async (tx) => void (await tx.insert(organizations).values(DEMO_ORGANIZATIONS)) },
  { name: 'demo-accounts-v1', apply: seedDemoAccounts },
  { name: 'demo-libraries-v1', apply: seedDemoLibraries },
  { name: 'demo-supply-plans-v1', apply: seedDemoSupplyPlans },
  { name: 'demo-formulas-v1', apply: seedDemoFormulas },
  { name: 'demo-shares-v1', apply: seedDemoShares },
];

/** Applies the seed steps that have not run yet; returns the names applied. */
export async function seedDemoData(db: Db, steps: SeedStep[] = DEMO_SEED_STEPS): Promise<string[]> {
  const applied: string[] = [];
  for (const step of steps) {
    const done = await db.select().from(seedRuns).where(eq(seedRuns.name, step.name));
    if (done.length > 0) continue;
    await db.transaction(async (tx) => {
      await step.apply(tx as unknown as Db);
      await tx.insert(seedRuns).values({ name: step.name });
    });
    applied.push(step.name);
  }
  return applied;
}
