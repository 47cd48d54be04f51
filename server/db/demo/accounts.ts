import { eq } from 'drizzle-orm';
import { generateIdFromEntropySize } from 'lucia';

import type { Role } from '../../../src/shared/permissions';
import { hashPassword } from '../../auth/passwords';
import type { Db } from '../client';
import { memberships, organizations, users } from '../schema';

/** The password of every demo account (listed in the README). Demo data only. */
export const DEMO_PASSWORD = 'troughline-demo';

/** One invented person per role at the demo mill; the advisor also advises the demo farm. */
export const DEMO_ACCOUNTS: { email: string; name: string; memberships: { organization: string; role: Role }[] }[] = [
  { email: 'owner@tamsby.example', name: 'Wenna Castell', memberships: [{ organization: 'Tamsby Cooperative Feed Mill', role: 'owner' }] },
  { email: 'nutritionist@tamsby.example', name: 'Idris Okonjo', memberships: [{ organization: 'Tamsby Cooperative Feed Mill', role: 'nutritionist' }] },
  { email: 'operator@tamsby.example', name: 'Piet Vallance', memberships: [{ organization: 'Tamsby Cooperative Feed Mill', role: 'mill_operator' }] },
  {
    email: 'advisor@upperwend.example',
    name: 'Saoirse Mbeki-Lund',
    memberships: [
      { organization: 'Upper Wend Extension Office', role: 'owner' },
      { organization: 'Tamsby Cooperative Feed Mill', role: 'advisor' },
      { organization: 'Orrin Hollow Larvae Farm', role: 'advisor' },
    ],
  },
  {
    email: 'farmer@orrinhollow.example',
    name: 'Tomasz Arkwell',
    memberships: [
      { organization: 'Tamsby Cooperative Feed Mill', role: 'farm_member' },
      { organization: 'Orrin Hollow Larvae Farm', role: 'owner' },
    ],
  },
];

/** Seed step: the demo accounts above (needs the demo organizations). */
export async function seedDemoAccounts(tx: Db): Promise<void> {
  const passwordHash = await hashPassword(DEMO_PASSWORD);
  for (const account of DEMO_ACCOUNTS) {
    const id = generateIdFromEntropySize(10);
    await tx.insert(users).values({ id, email: account.email, name: account.name, passwordHash });
    for (const membership of account.memberships) {
      const [org] = await tx.select({ id: organizations.id }).from(organizations).where(eq(organizations.name, membership.organization));
      if (!org) throw new Error(`Demo organization missing: ${membership.organization}`);
      await tx.insert(memberships).values({ userId: id, organizationId: org.id, role: membership.role });
    }
  }
}
