import assert from 'node:assert/strict';
import { after, before, describe, test } from 'node:test';
import { eq } from 'drizzle-orm';

import { SESSION_COOKIE } from '../../server/auth/lucia';
import { passwordResets, sessions } from '../../server/db/schema';
import { client, createOrganization, createUser, FIXTURE_PASSWORD, signedInClient } from '../helpers/accounts';
import { startTestApp, waitForMail, type TestApp } from '../helpers/app';
import { requestJson } from '../helpers/http';

const linkToken = (text: string, path: string) => {
  const match = text.match(new RegExp(`${path}\\?token=([A-Za-z0-9_-]+)`));
  assert.ok(match, `a ${path} link in the mail:\n${text}`);
  return match[1];
};

describe('accounts', () => {
  let t: TestApp;
  before(async () => {
    t = await startTestApp('accounts');
  });
  after(async () => t?.close());

  describe('POST /api/auth/sign-up', () => {
    test('creates the person, an organization they own, and a session cookie that is HttpOnly and SameSite=Lax', async () => {
      const c = client(t.server.baseUrl);
      const { status, body, headers } = await c.call('POST', '/api/auth/sign-up', { email: 'Mira@Example.org', password: 'a-long-password-1', name: 'Mira', organizationName: 'Brackenford Farm', organizationKind: 'farm' });
      assert.equal(status, 201);
      assert.equal(body.user.email, 'mira@example.org', 'e-mail is kept in lower case');
      assert.deepEqual(body.memberships.map((m: { role: string; organizationName: string }) => [m.organizationName, m.role]), [['Brackenford Farm', 'owner']]);
      const cookie = headers.get('set-cookie') ?? '';
      assert.match(cookie, new RegExp(`^${SESSION_COOKIE}=`));
      assert.match(cookie, /HttpOnly/i);
      assert.match(cookie, /SameSite=Lax/i);
      assert.doesNotMatch(cookie, /Secure/i, 'not Secure over plain http');
      const me = await c.call('GET', '/api/auth/me');
      assert.equal(me.status, 200);
      assert.equal(me.body.activeOrganizationId, body.memberships[0].organizationId);
    });

    test('answers 409 with the field named when the e-mail is taken, and 400 naming each bad field', async () => {
      const c = client(t.server.baseUrl);
      const taken = await c.call('POST', '/api/auth/sign-up', { email: 'mira@example.org', password: 'a-long-password-1', name: 'Other', organizationName: 'X Mill' });
      assert.equal(taken.status, 409);
      assert.ok(taken.body.error.fieldErrors.email);
      const bad = await c.call('POST', '/api/auth/sign-up', { email: 'not-an-email', password: 'short', name: '' });
      assert.equal(bad.status, 400);
      assert.deepEqual(Object.keys(bad.body.error.fieldErrors).sort(), ['email', 'name', 'organizationName', 'password']);
    });
  });

  describe('POST /api/auth/sign-in', () => {
    test('answers an unknown e-mail and a wrong password with the same status and words', async () => {
      await createUser(t.database.db, { email: 'known@example.org' });
      const unknown = await client(t.server.baseUrl).call('POST', '/api/auth/sign-in', { email: 'nobody@example.org', password: 'whatever-123' });
      const wrong = await client(t.server.baseUrl).call('POST', '/api/auth/sign-in', { email: 'known@example.org', password: 'whatever-123' });
      assert.equal(unknown.status, 401);
      assert.equal(wrong.status, 401);
      assert.deepEqual(unknown.body, wrong.body);
    });

    test('refuses further attempts for an address after 10 failures, with Retry-After', async () => {
      await createUser(t.database.db, { email: 'target@example.org' });
      const c = client(t.server.baseUrl);
      for (let i = 0; i < 10; i++) assert.equal((await c.call('POST', '/api/auth/sign-in', { email: 'target@example.org', password: `guess-${i}-xxxx` })).status, 401);
      const blocked = await c.call('POST', '/api/auth/sign-in', { email: 'target@example.org', password: FIXTURE_PASSWORD });
      assert.equal(blocked.status, 429, 'even the right password waits out the window');
      assert.ok(Number(blocked.headers.get('retry-after')) > 0);
    });
  });

  describe('cross-site requests', () => {
    test('a state-changing request without our Origin is refused with 403', async () => {
      const noOrigin = await requestJson(t.server.baseUrl, '/api/auth/sign-in', { method: 'POST', body: JSON.stringify({ email: 'a@example.org', password: 'x' }) });
      assert.equal(noOrigin.status, 403);
      assert.equal(noOrigin.body.error.code, 'cross_site_request');
      const foreign = await requestJson(t.server.baseUrl, '/api/auth/sign-in', { method: 'POST', headers: { origin: 'https://evil.example' }, body: JSON.stringify({ email: 'a@example.org', password: 'x' }) });
      assert.equal(foreign.status, 403);
    });
  });

  describe('password reset through the fake SMTP server', () => {
    test('mails a single-use link; the new password works, the old one and old sessions do not', async () => {
      await createUser(t.database.db, { email: 'forgetful@example.org' });
      const oldSession = await signedInClient(t.server.baseUrl, 'forgetful@example.org');
      const asked = await client(t.server.baseUrl).call('POST', '/api/auth/password-reset', { email: 'forgetful@example.org' });
      assert.equal(asked.status, 202);
      const unknown = await client(t.server.baseUrl).call('POST', '/api/auth/password-reset', { email: 'nobody-here@example.org' });
      assert.deepEqual(unknown.body, asked.body, 'the answer does not reveal whether the account exists');

      const mail = await waitForMail(t.inbox, (m) => m.to.includes('forgetful@example.org') && /reset/i.test(m.subject));
      const token = linkToken(mail.text, '/reset-password');
      const confirm = await client(t.server.baseUrl).call('POST', '/api/auth/password-reset/confirm', { token, password: 'brand-new-password-9' });
      assert.equal(confirm.status, 200);

      assert.equal((await oldSession.call('GET', '/api/auth/me')).status, 401, 'old sessions end');
      assert.equal((await client(t.server.baseUrl).call('POST', '/api/auth/sign-in', { email: 'forgetful@example.org', password: FIXTURE_PASSWORD })).status, 401);
      assert.equal((await client(t.server.baseUrl).call('POST', '/api/auth/sign-in', { email: 'forgetful@example.org', password: 'brand-new-password-9' })).status, 200);
      const again = await client(t.server.baseUrl).call('POST', '/api/auth/password-reset/confirm', { token, password: 'another-password-10' });
      assert.equal(again.status, 400, 'the link works once');
    });

    test('an expired link is refused', async () => {
      await createUser(t.database.db, { email: 'late@example.org' });
      await client(t.server.baseUrl).call('POST', '/api/auth/password-reset', { email: 'late@example.org' });
      const mail = await waitForMail(t.inbox, (m) => m.to.includes('late@example.org'));
      await t.database.db.update(passwordResets).set({ expiresAt: new Date(Date.now() - 1000) });
      const late = await client(t.server.baseUrl).call('POST', '/api/auth/password-reset/confirm', { token: linkToken(mail.text, '/reset-password'), password: 'brand-new-password-9' });
      assert.equal(late.status, 400);
      assert.equal(late.body.error.code, 'invalid_token');
    });
  });

  describe('invitations through the fake SMTP server', () => {
    test('a new person follows the mailed link, signs up and joins with the role given', async () => {
      const org = await createOrganization(t.database.db, 'Hetherby Mill');
      await createUser(t.database.db, { email: 'boss@hetherby.example', organizationId: org.id, role: 'owner' });
      const owner = await signedInClient(t.server.baseUrl, 'boss@hetherby.example');
      const sent = await owner.call('POST', '/api/invitations', { email: 'newcomer@example.org', role: 'mill_operator' });
      assert.equal(sent.status, 201);
      assert.equal((await owner.call('GET', '/api/invitations')).body.length, 1);

      const mail = await waitForMail(t.inbox, (m) => m.to.includes('newcomer@example.org'));
      assert.match(mail.subject, /Hetherby Mill/);
      const token = linkToken(mail.text, '/invitation');
      const preview = await client(t.server.baseUrl).call('GET', `/api/invitations/preview?token=${token}`);
      assert.deepEqual(preview.body, { organizationName: 'Hetherby Mill', role: 'mill_operator', email: 'newcomer@example.org', accountExists: false });

      const newcomer = client(t.server.baseUrl);
      const joined = await newcomer.call('POST', '/api/auth/sign-up', { email: 'newcomer@example.org', password: 'a-long-password-1', name: 'Newcomer', invitationToken: token });
      assert.equal(joined.status, 201);
      assert.deepEqual(joined.body.memberships.map((m: { organizationName: string; role: string }) => [m.organizationName, m.role]), [['Hetherby Mill', 'mill_operator']]);
      assert.equal((await owner.call('GET', '/api/invitations')).body.length, 0, 'no longer pending');
      const members = await owner.call('GET', '/api/members');
      assert.deepEqual(members.body.map((m: { email: string; role: string }) => [m.email, m.role]).sort(), [['boss@hetherby.example', 'owner'], ['newcomer@example.org', 'mill_operator']]);
      assert.equal((await client(t.server.baseUrl).call('GET', `/api/invitations/preview?token=${token}`)).status, 404, 'used once');
    });

    test('someone with an account accepts while signed in and can switch between organizations', async () => {
      const mill = await createOrganization(t.database.db, 'Coldharbour Mill');
      const farm = await createOrganization(t.database.db, 'Fennick Farm', 'farm');
      await createUser(t.database.db, { email: 'owner@coldharbour.example', organizationId: mill.id, role: 'owner' });
      await createUser(t.database.db, { email: 'adviser@fennick.example', organizationId: farm.id, role: 'owner' });
      const owner = await signedInClient(t.server.baseUrl, 'owner@coldharbour.example');
      await owner.call('POST', '/api/invitations', { email: 'adviser@fennick.example', role: 'advisor' });
      const mail = await waitForMail(t.inbox, (m) => m.to.includes('adviser@fennick.example'));
      const adviser = await signedInClient(t.server.baseUrl, 'adviser@fennick.example');
      const wrongPerson = await owner.call('POST', '/api/invitations/accept', { token: linkToken(mail.text, '/invitation') });
      assert.equal(wrongPerson.status, 403, 'an invitation is for the address it was sent to');
      const accepted = await adviser.call('POST', '/api/invitations/accept', { token: linkToken(mail.text, '/invitation') });
      assert.equal(accepted.status, 200);
      assert.equal(accepted.body.activeOrganizationId, mill.id);
      assert.equal((await adviser.call('GET', '/api/members')).body.length, 2, 'sees the mill’s members now');
      const back = await adviser.call('PUT', '/api/auth/active-organization', { organizationId: farm.id });
      assert.equal(back.status, 200);
      assert.deepEqual((await adviser.call('GET', '/api/members')).body.map((m: { email: string }) => m.email), ['adviser@fennick.example']);
      const [row] = await t.database.db.select().from(sessions).where(eq(sessions.activeOrganizationId, farm.id));
      assert.ok(row, 'the active organization is kept on the session');
    });
  });

  describe('members', () => {
    test('the last owner can be neither demoted nor removed', async () => {
      const org = await createOrganization(t.database.db, 'Solo Mill');
      await createUser(t.database.db, { email: 'solo@example.org', organizationId: org.id, role: 'owner' });
      const owner = await signedInClient(t.server.baseUrl, 'solo@example.org');
      const [me] = (await owner.call('GET', '/api/members')).body;
      const demote = await owner.call('PATCH', `/api/members/${me.id}`, { role: 'nutritionist' });
      assert.equal(demote.status, 409);
      assert.equal((await owner.call('DELETE', `/api/members/${me.id}`)).status, 409);
      assert.equal((await owner.call('GET', '/api/members')).body[0].role, 'owner', 'nothing changed');
    });
  });
});

describe('a new organization', () => {
  let t: TestApp;
  before(async () => {
    t = await startTestApp('new_org_library');
    const { seedDemoData } = await import('../../server/db/seed');
    await seedDemoData(t.database.db);
  });
  after(async () => t?.close());

  test('starts with its own library copied from the reference tables', async () => {
    const c = client(t.server.baseUrl);
    const signUp = await c.call('POST', '/api/auth/sign-up', { email: 'fresh@example.org', password: 'a-long-password-1', name: 'Fresh', organizationName: 'Fresh Farm', organizationKind: 'farm' });
    assert.equal(signUp.status, 201);
    const own = await c.call('GET', '/api/ingredients?library=own&pageSize=5');
    const reference = await c.call('GET', '/api/ingredients?library=reference&pageSize=5');
    assert.equal(own.status, 200);
    assert.ok(own.body.total > 0, 'the own library is not empty');
    assert.equal(own.body.total, reference.body.total, 'every reference ingredient was copied');
  });
});
