import { createHash, randomBytes } from 'node:crypto';

import { invitations } from '../../../server/db/schema';
import { createOrganization, createUser } from '../../helpers/accounts';
import { allowOnly, CALLERS, type AuthWorld, type Caller, type RuleSet } from './types';

const every = (status: number) => Object.fromEntries(CALLERS.map((caller) => [caller, status])) as Record<Caller, number>;
const signedIn = (status: number) => ({ ...every(status), signed_out: 401 });

let counter = 0;
const uniqueEmail = (label: string) => `${label}-${Date.now()}-${counter++}@example.org`;

async function invite(world: AuthWorld, organizationId: number, email: string) {
  const token = randomBytes(32).toString('base64url');
  const tokenHash = createHash('sha256').update(token).digest('hex');
  const [row] = await world.db
    .insert(invitations)
    .values({ organizationId, email, role: 'farm_member', tokenHash, expiresAt: new Date(Date.now() + 86_400_000) })
    .$returningId();
  return { id: row.id, token };
}

/** Accounts, sessions, invitations, members, health and the development inbox. */
export const accountsRules: RuleSet = {
  area: 'accounts',
  cases: async (world) => {
    const orgC = await createOrganization(world.db, 'Invitation Target Farm', 'farm');
    const newMemberOfA = async () => {
      const user = await createUser(world.db, { email: uniqueEmail('member'), organizationId: world.orgA.id, role: 'farm_member' });
      const [row] = await world.db.query.memberships.findMany({ where: (m, { eq }) => eq(m.userId, user.id) });
      return `/api/members/${row.id}`;
    };
    return [
      { method: 'GET', pattern: '/api/health', url: '/api/health', expect: every(200) },
      {
        method: 'POST',
        pattern: '/api/auth/sign-up',
        url: '/api/auth/sign-up',
        freshSession: true,
        prepare: async () => ({ body: { email: uniqueEmail('new'), password: 'a-long-password-1', name: 'New Person', organizationName: 'New Mill' } }),
        expect: every(201),
      },
      { method: 'POST', pattern: '/api/auth/sign-in', url: '/api/auth/sign-in', freshSession: true, prepare: async () => ({ body: { email: world.emails.owner, password: 'fixture-password-42' } }), expect: every(200) },
      { method: 'POST', pattern: '/api/auth/sign-out', url: '/api/auth/sign-out', freshSession: true, expect: signedIn(204) },
      { method: 'GET', pattern: '/api/auth/me', url: '/api/auth/me', expect: signedIn(200) },
      {
        method: 'PUT',
        pattern: '/api/auth/active-organization',
        url: '/api/auth/active-organization',
        body: { organizationId: world.orgA.id },
        expect: { ...signedIn(200), outsider: 404 },
      },
      { method: 'POST', pattern: '/api/auth/password-reset', url: '/api/auth/password-reset', body: { email: 'nobody@example.org' }, expect: every(202) },
      {
        method: 'POST',
        pattern: '/api/auth/password-reset/confirm',
        url: '/api/auth/password-reset/confirm',
        body: { token: 'x'.repeat(43), password: 'a-long-password-1' },
        expect: every(400),
      },
      { method: 'GET', pattern: '/api/invitations', url: '/api/invitations', expect: allowOnly(['owner'], 200, { outsider: 200 }) },
      {
        method: 'POST',
        pattern: '/api/invitations',
        url: '/api/invitations',
        prepare: async () => ({ body: { email: uniqueEmail('invited'), role: 'advisor' } }),
        expect: allowOnly(['owner'], 201, { outsider: 201 }),
      },
      {
        method: 'DELETE',
        pattern: '/api/invitations/:id',
        url: '',
        prepare: async () => ({ url: `/api/invitations/${(await invite(world, world.orgA.id, uniqueEmail('withdrawn'))).id}` }),
        expect: allowOnly(['owner'], 204, { outsider: 404 }),
      },
      {
        method: 'GET',
        pattern: '/api/invitations/preview',
        url: '',
        prepare: async () => ({ url: `/api/invitations/preview?token=${(await invite(world, world.orgA.id, uniqueEmail('preview'))).token}` }),
        expect: every(200),
      },
      {
        method: 'POST',
        pattern: '/api/invitations/accept',
        url: '/api/invitations/accept',
        freshSession: true,
        // Each caller accepts an invitation addressed to their own e-mail, into a third organization.
        prepare: async (caller) => ({ body: { token: (await invite(world, orgC.id, caller === 'signed_out' ? uniqueEmail('anon') : world.emails[caller])).token } }),
        expect: signedIn(200),
      },
      { method: 'GET', pattern: '/api/members', url: '/api/members', expect: allowOnly(['owner', 'nutritionist', 'mill_operator', 'advisor', 'farm_member'], 200, { outsider: 200 }) },
      {
        method: 'PATCH',
        pattern: '/api/members/:id',
        url: '',
        body: { role: 'advisor' },
        prepare: async () => ({ url: await newMemberOfA() }),
        expect: allowOnly(['owner'], 200, { outsider: 404 }),
      },
      {
        method: 'DELETE',
        pattern: '/api/members/:id',
        url: '',
        prepare: async () => ({ url: await newMemberOfA() }),
        expect: allowOnly(['owner'], 204, { outsider: 404 }),
      },
      { method: 'GET', pattern: '/api/dev/mail', url: '/api/dev/mail', expect: every(200) },
    ];
  },
};
