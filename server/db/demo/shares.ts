import { and, eq, isNotNull } from 'drizzle-orm';
import { generateIdFromEntropySize } from 'lucia';

import { hashPassword } from '../../auth/passwords';
import type { Mailer } from '../../mail/mailer';
import type { Db } from '../client';
import { createShare } from '../queries/shares';
import { formulas, formulaVersions, memberships, organizations, users } from '../schema';
import { DEMO_PASSWORD } from './accounts';

/** A worker at the demo larvae farm whose only membership is there: the farm member who reads shared results. */
export const DEMO_FARM_WORKER = { email: 'worker@orrinhollow.example', name: 'Lenka Fairbairn', organization: 'Orrin Hollow Larvae Farm' };

// The demo records the share as sent without sending mail: there is nobody at the demo addresses to receive it.
const demoMailer: Mailer = { from: '', send: async () => undefined };

async function orgId(tx: Db, name: string): Promise<number> {
  const [org] = await tx.select({ id: organizations.id }).from(organizations).where(eq(organizations.name, name));
  if (!org) throw new Error(`Demo organization missing: ${name}`);
  return org.id;
}

/**
 * Seed step: the farm worker account, and the advisor's share of the mill's approved broiler starter with the farm,
 * so a farm member signing in sees a shared result at once.
 */
export async function seedDemoShares(tx: Db): Promise<void> {
  const farmId = await orgId(tx, DEMO_FARM_WORKER.organization);
  const millId = await orgId(tx, 'Tamsby Cooperative Feed Mill');
  const workerId = generateIdFromEntropySize(10);
  await tx.insert(users).values({ id: workerId, email: DEMO_FARM_WORKER.email, name: DEMO_FARM_WORKER.name, passwordHash: await hashPassword(DEMO_PASSWORD) });
  await tx.insert(memberships).values({ userId: workerId, organizationId: farmId, role: 'farm_member' });

  const [approved] = await tx
    .select({ formulaId: formulaVersions.formulaId, versionId: formulaVersions.id })
    .from(formulaVersions)
    .innerJoin(formulas, eq(formulas.id, formulaVersions.formulaId))
    .where(and(eq(formulaVersions.organizationId, millId), isNotNull(formulaVersions.approvedAt)));
  const [advisor] = await tx.select({ id: users.id }).from(users).where(eq(users.email, 'advisor@upperwend.example'));
  if (!approved || !advisor) throw new Error('Demo shares need the demo formulas and accounts first');
  await createShare(
    tx,
    demoMailer,
    { organizationId: millId, userId: advisor.id },
    { kind: 'formula_version', formulaId: approved.formulaId, versionId: approved.versionId, toOrganizationId: farmId, note: 'The starter the mill approved for the spring placements; ask me before changing it.' },
    'http://127.0.0.1:8640',
  );
}
