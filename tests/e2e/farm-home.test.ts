import assert from 'node:assert/strict';
import { after, before, describe, test } from 'node:test';
import type { Browser, Page } from 'playwright-core';

import { WEB_DIST } from '../../server/index';
import { createOrganization, createUser, FIXTURE_PASSWORD } from '../helpers/accounts';
import { startTestApp, type TestApp } from '../helpers/app';
import { launchBrowser, signInThroughForm } from '../helpers/browser';

const visible = (page: Page, testId: string) => page.locator(`[data-testid="${testId}"]:visible`);

describe('the Formulas section by role', () => {
  let t: TestApp;
  let browser: Browser;

  before(async () => {
    t = await startTestApp('e2e_farm_home', { webDist: WEB_DIST });
    const farm = await createOrganization(t.database.db, 'Brackenfold Farm', 'farm');
    await createUser(t.database.db, { email: 'member@brackenfold.example', organizationId: farm.id, role: 'farm_member' });
    browser = await launchBrowser();
  });
  after(async () => {
    await browser?.close();
    await t?.close();
  });

  test('a farm member on a 360 px phone gets the ration check and shared results, never a refusal', async () => {
    const page = await browser.newPage({ viewport: { width: 360, height: 740 } });
    await signInThroughForm(page, t.server.baseUrl, 'member@brackenfold.example', FIXTURE_PASSWORD);
    await visible(page, 'received-shares').waitFor();
    assert.equal(await page.locator('[data-testid="error-state"]:visible').count(), 0, 'no error where the section opens');
    await visible(page, 'open-ration-check').click();
    await visible(page, 'screen-ration-check').waitFor();
    await page.close();
  });
});

describe('the demo farm member', () => {
  let t: TestApp;
  let browser: Browser;

  before(async () => {
    t = await startTestApp('e2e_demo_farm', { webDist: WEB_DIST });
    const { seedDemoData } = await import('../../server/db/seed');
    await seedDemoData(t.database.db);
    browser = await launchBrowser();
  });
  after(async () => {
    await browser?.close();
    await t?.close();
  });

  test('finds the starter formula the advisor shared with the farm and opens it read-only', async () => {
    const { DEMO_FARM_WORKER } = await import('../../server/db/demo/shares');
    const { DEMO_PASSWORD } = await import('../../server/db/demo/accounts');
    const page = await browser.newPage({ viewport: { width: 360, height: 740 } });
    await signInThroughForm(page, t.server.baseUrl, DEMO_FARM_WORKER.email, DEMO_PASSWORD);
    const share = page.locator('[data-testid^="received-share-"]:visible').first();
    await share.waitFor();
    assert.match(await share.innerText(), /Broiler starter/);
    await share.click();
    await visible(page, 'screen-shared-result').waitFor();
    await visible(page, 'caution-banner').waitFor();
    await page.close();
  });
});
