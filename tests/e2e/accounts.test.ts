import assert from 'node:assert/strict';
import { join } from 'node:path';
import { after, before, describe, test } from 'node:test';
import type { Browser, Page } from 'playwright-core';

import { WEB_DIST } from '../../server/index';
import { createOrganization, createUser, FIXTURE_PASSWORD } from '../helpers/accounts';
import { startTestApp, waitForMail, type TestApp } from '../helpers/app';
import { launchBrowser, PHONE, signInThroughForm, TEST_OUTPUT, WIDE } from '../helpers/browser';

const visible = (page: Page, testId: string) => page.locator(`[data-testid="${testId}"]:visible`);

describe('accounts in the browser', () => {
  let t: TestApp;
  let browser: Browser;

  before(async () => {
    t = await startTestApp('e2e_accounts', { webDist: WEB_DIST });
    const org = await createOrganization(t.database.db, 'Lowmoor Feed Mill');
    await createUser(t.database.db, { email: 'owner@lowmoor.example', name: 'Owner Person', organizationId: org.id, role: 'owner' });
    await createUser(t.database.db, { email: 'farmer@lowmoor.example', name: 'Farm Person', organizationId: org.id, role: 'farm_member' });
    browser = await launchBrowser();
  });
  after(async () => {
    await browser?.close();
    await t?.close();
  });

  test('an owner sees the invitation form and member controls; a farm member sees neither', async () => {
    const owner = await browser.newPage({ viewport: WIDE });
    await signInThroughForm(owner, t.server.baseUrl, 'owner@lowmoor.example', FIXTURE_PASSWORD);
    await visible(owner, 'nav-account').click();
    await visible(owner, 'invite-card').waitFor();
    await visible(owner, 'member-farmer@lowmoor.example').waitFor();
    assert.ok((await owner.locator('[data-testid^="member-remove-"]:visible').count()) >= 1, 'owners can remove members');
    await owner.screenshot({ path: join(TEST_OUTPUT, 'account-owner-wide.png'), fullPage: true });

    const farmer = await browser.newPage({ viewport: PHONE });
    await signInThroughForm(farmer, t.server.baseUrl, 'farmer@lowmoor.example', FIXTURE_PASSWORD);
    await visible(farmer, 'nav-account').click();
    await visible(farmer, 'members-card').waitFor();
    await visible(farmer, 'member-owner@lowmoor.example').waitFor();
    assert.match(await visible(farmer, 'you-role').innerText(), /Farm member at Lowmoor Feed Mill/);
    assert.equal(await farmer.locator('[data-testid="invite-card"]').count(), 0, 'no invitation form for a farm member');
    assert.equal(await farmer.locator('[data-testid^="member-remove-"]').count(), 0, 'no remove buttons for a farm member');
    await farmer.screenshot({ path: join(TEST_OUTPUT, 'account-farm-member-phone.png'), fullPage: true });
    await owner.close();
    await farmer.close();
  });

  test('an owner invites by e-mail; the invited person follows the mailed link, signs up and lands in the mill', async () => {
    const owner = await browser.newPage({ viewport: PHONE });
    await signInThroughForm(owner, t.server.baseUrl, 'owner@lowmoor.example', FIXTURE_PASSWORD);
    await owner.goto(`${t.server.baseUrl}/account`);
    await visible(owner, 'invite-email').fill('operator@lowmoor.example');
    await visible(owner, 'invite-role-mill_operator').click();
    await visible(owner, 'invite-submit').click();
    await visible(owner, 'pending-invitations').waitFor();
    assert.match(await visible(owner, 'invite-message').innerText(), /Invitation sent to operator@lowmoor\.example/);

    const mail = await waitForMail(t.inbox, (m) => m.to.includes('operator@lowmoor.example'));
    const link = mail.text.match(/https?:\/\/\S+\/invitation\?token=\S+/)?.[0];
    assert.ok(link, 'the mail carries an invitation link');
    const invited = await browser.newPage({ viewport: PHONE });
    await invited.goto(link);
    await visible(invited, 'invitation-sign-up').click();
    await visible(invited, 'sign-up-name').fill('Mill Operator');
    await visible(invited, 'sign-up-password').fill('operator-password-1');
    await visible(invited, 'sign-up-submit').click();
    await visible(invited, 'screen-formulas').waitFor();
    await visible(invited, 'nav-account').click();
    assert.match(await visible(invited, 'you-role').innerText(), /Mill operator at Lowmoor Feed Mill/);
    await owner.close();
    await invited.close();
  });

  test('a forgotten password is reset through the mailed link, and a wrong password is answered plainly', async () => {
    const page = await browser.newPage({ viewport: PHONE });
    await page.goto(`${t.server.baseUrl}/sign-in`);
    await visible(page, 'sign-in-email').fill('farmer@lowmoor.example');
    await visible(page, 'sign-in-password').fill('not-the-password');
    await visible(page, 'sign-in-submit').click();
    assert.match(await visible(page, 'sign-in-error').innerText(), /do not match an account/);
    assert.equal(await visible(page, 'sign-in-email').inputValue(), 'farmer@lowmoor.example', 'what was typed is kept');

    await visible(page, 'link-forgot-password').click();
    await visible(page, 'forgot-email').fill('farmer@lowmoor.example');
    await visible(page, 'forgot-submit').click();
    await visible(page, 'forgot-message').waitFor();
    const mail = await waitForMail(t.inbox, (m) => m.to.includes('farmer@lowmoor.example') && /reset/i.test(m.subject));
    const link = mail.text.match(/https?:\/\/\S+\/reset-password\?token=\S+/)?.[0];
    assert.ok(link);
    await page.goto(link);
    await visible(page, 'reset-password').fill('new-farm-password-7');
    await visible(page, 'reset-repeat').fill('new-farm-password-7');
    await visible(page, 'reset-submit').click();
    assert.match(await visible(page, 'reset-message').innerText(), /password is changed/);
    await signInThroughForm(page, t.server.baseUrl, 'farmer@lowmoor.example', 'new-farm-password-7');
    await page.close();
  });
});
