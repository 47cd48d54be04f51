import assert from 'node:assert/strict';
import { join } from 'node:path';
import { after, before, describe, test } from 'node:test';
import type { Browser, Page } from 'playwright-core';

import { REFERENCE_LIBRARY_STEP, seedDemoData } from '../../server/db/seed';
import { WEB_DIST } from '../../server/index';
import { createOrganization, createUser, FIXTURE_PASSWORD, signedInClient } from '../helpers/accounts';
import { startTestApp, type TestApp } from '../helpers/app';
import { launchBrowser, PHONE, signInThroughForm, TEST_OUTPUT } from '../helpers/browser';

const EMAIL = 'nutritionist@hallowmere.example';
const visible = (page: Page, testId: string) => page.locator(`[data-testid="${testId}"]:visible`);

describe('adjusting a copied specification', () => {
  let t: TestApp;
  let browser: Browser;

  before(async () => {
    t = await startTestApp('e2e_requirements', { webDist: WEB_DIST });
    await seedDemoData(t.database.db, [REFERENCE_LIBRARY_STEP]);
    const org = await createOrganization(t.database.db, 'Hallowmere Mill');
    await createUser(t.database.db, { email: EMAIL, organizationId: org.id, role: 'nutritionist' });
    browser = await launchBrowser();
  });
  after(async () => {
    await browser?.close();
    await t?.close();
  });

  test('on a phone: add a fibre ceiling, tighten a ratio and an insect cap, and the saved specification says so', async () => {
    const page = await browser.newPage({ viewport: PHONE });
    await signInThroughForm(page, t.server.baseUrl, EMAIL, FIXTURE_PASSWORD);
    await page.goto(`${t.server.baseUrl}/requirements`);
    await page.locator('[data-testid^="spec-card-"]:visible', { hasText: 'Broiler starter' }).first().click();
    await visible(page, 'spec-copy').click();
    await visible(page, 'spec-edit').click();

    // A cap above 100 % is refused with a message, and nothing is saved.
    await visible(page, 'cap-max-0').fill('140');
    await visible(page, 'spec-save').click();
    await page.locator('text=At most 100 %.').first().waitFor();

    await visible(page, 'cap-max-0').fill('8');
    await visible(page, 'ratio-min-0').fill('2.0');
    // A fibre ceiling: crude fibre is not bounded in the published starter table.
    await visible(page, 'spec-add-search').fill('fibre');
    await visible(page, 'spec-add-cf').click();
    await visible(page, 'bound-max-cf').fill('5');
    await page.screenshot({ path: join(TEST_OUTPUT, 'requirements-adjust-phone.png'), fullPage: true });
    await visible(page, 'spec-save').click();
    await visible(page, 'bound-cf').waitFor();

    // Read back what was stored, through the API.
    const id = Number(new URL(page.url()).pathname.split('/').pop());
    const api = await signedInClient(t.server.baseUrl, EMAIL);
    const { body } = await api.call('GET', `/api/specifications/${id}`);
    assert.equal(body.bounds.find((b: { nutrientId: string }) => b.nutrientId === 'cf').max, 5);
    assert.equal(body.ratios[0].min, 2);
    assert.equal(body.caps[0].maxPct, 8);
    await page.close();
  });
});
