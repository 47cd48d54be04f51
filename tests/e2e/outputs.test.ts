import assert from 'node:assert/strict';
import { statSync } from 'node:fs';
import { join } from 'node:path';
import { after, before, describe, test } from 'node:test';
import type { Browser, Page } from 'playwright-core';

import { DEMO_PASSWORD } from '../../server/db/demo/accounts';
import { seedDemoData } from '../../server/db/seed';
import { WEB_DIST } from '../../server/index';
import type { ApprovedFormula } from '../../src/shared/schemas/formulas';
import { createOrganization, createUser, FIXTURE_PASSWORD, signedInClient } from '../helpers/accounts';
import { startTestApp, waitForMail, type TestApp } from '../helpers/app';
import { launchBrowser, signInThroughForm, TEST_OUTPUT, WIDE } from '../helpers/browser';

const visible = (page: Page, testId: string) => page.locator(`[data-testid="${testId}"]:visible`);
const NARROW_PHONE = { width: 360, height: 740 };

/** Batch sheet printing, the ration check on a 360 px phone, and sharing through the fake inbox, on the demo scenario. */
describe('batch sheets, ration checks and sharing in the browser', () => {
  let t: TestApp;
  let browser: Browser;
  let approvedId: number;

  before(async () => {
    t = await startTestApp('e2e_outputs', { webDist: WEB_DIST });
    const db = t.database.db;
    await seedDemoData(db);
    const elsewhere = await createOrganization(db, 'Lower Wend Hen Farm', 'farm');
    await createUser(db, { email: 'keeper@lowerwend.example', organizationId: elsewhere.id, role: 'owner' });
    const operator = await signedInClient(t.server.baseUrl, 'operator@tamsby.example', DEMO_PASSWORD);
    approvedId = ((await operator.call('GET', '/api/formulas/approved')).body as ApprovedFormula[])[0].version.id;
    browser = await launchBrowser();
  });
  after(async () => {
    await browser?.close();
    await t?.close();
  });

  test('batch sheet: amounts for 2000 kg add up, the page prints to PDF at A4 and Letter with the caution, a batch is recorded', async () => {
    const page = await browser.newPage({ viewport: WIDE });
    await signInThroughForm(page, t.server.baseUrl, 'operator@tamsby.example', DEMO_PASSWORD);
    await page.goto(`${t.server.baseUrl}/batch-sheet/${approvedId}`);
    await visible(page, 'sheet-table').waitFor();
    await visible(page, 'sheet-batch-size').fill('2000');
    await visible(page, 'sheet-apply').click();
    await page.getByText('Amounts for 2000 kg').waitFor();
    const amounts = await page.locator('[data-testid="sheet-amount"]:visible').evaluateAll((cells) => cells.map((c) => Number(/^([\d.]+)\s*kg$/.exec((c.textContent ?? '').trim())?.[1] ?? 'NaN')));
    assert.ok(amounts.length >= 3 && amounts.every(Number.isFinite), `amounts read: ${amounts}`);
    const total = amounts.reduce((s, a) => s + a, 0);
    assert.ok(Math.abs(total - 2000) <= 0.25 + 1e-9, `printed amounts add up to ${total} kg`);
    assert.ok(await visible(page, 'sheet-call-out').count() > 0, 'premix or micro-ingredients are called out');
    await page.screenshot({ path: join(TEST_OUTPUT, 'outputs-batch-sheet-wide.png'), fullPage: true });

    await page.emulateMedia({ media: 'print' });
    assert.equal(await visible(page, 'caution-banner').count(), 1, 'the caution is printed');
    assert.equal(await visible(page, 'no-print-controls').count(), 0, 'controls are left off the print');
    await page.screenshot({ path: join(TEST_OUTPUT, 'outputs-batch-sheet-print.png'), fullPage: true });
    for (const format of ['A4', 'Letter'] as const) {
      const path = join(TEST_OUTPUT, `outputs-batch-sheet-${format}.pdf`);
      await page.pdf({ path, format, printBackground: true });
      assert.ok(statSync(path).size > 10_000, `${format} PDF written`);
    }
    await page.emulateMedia({ media: 'screen' });

    await visible(page, 'record-operator').fill('PV');
    await visible(page, 'record-deviation').fill('Mixed 2 minutes longer');
    await visible(page, 'record-submit').click();
    await visible(page, 'record-done').waitFor();
    await page.getByText('Batches made from this version').waitFor();
    await page.close();
  });

  test('ration check at 360 px: finds lysine short in a maize and soybean meal mix (NRC 1994 broiler starter, lysine 1.10 %)', async () => {
    const page = await browser.newPage({ viewport: NARROW_PHONE });
    await signInThroughForm(page, t.server.baseUrl, 'farmer@orrinhollow.example', DEMO_PASSWORD);
    await page.goto(`${t.server.baseUrl}/ration-check`);
    await visible(page, 'screen-ration-check').waitFor();
    await page.getByText('Broiler starter, 0–3 weeks').first().click();
    // A hand-made farm mix; the typed lysine values are the farmer's inputs (recalled from memory), not check values.
    const line = async (k: number, name: string, kg: string, price: string, lys: string) => {
      await visible(page, `ration-name-${k}`).fill(name);
      await visible(page, `ration-amount-${k}`).fill(kg);
      await visible(page, `ration-price-${k}`).fill(price);
      await visible(page, `ration-value-${k}-lys`).fill(lys);
    };
    await line(0, 'Home-grown grain', '700', '0.229', '0.26');
    await line(1, 'Co-op protein meal', '300', '0.512', '2.96');
    await visible(page, 'ration-submit').click();
    await visible(page, 'ration-results').waitFor();
    // (700 × 0.26 + 300 × 2.96) / 1000 = 1.07 % lysine, below the 1.10 % of NRC (1994), broiler starter 0–3 weeks.
    await page.getByText(/Lysine, total is short: 1\.07 % in your mix, at least 1\.10 % needed/).first().waitFor();
    await page.getByText(/0\.3139 EUR per kg/).first().waitFor();
    const overflow = await page.evaluate(() => document.documentElement.scrollWidth);
    assert.ok(overflow <= 360, `the page is ${overflow} px wide at 360 px`);
    const submitBox = await visible(page, 'ration-submit').boundingBox();
    assert.ok(submitBox && submitBox.height >= 48, 'a large touch target');
    await visible(page, 'ration-summary').scrollIntoViewIfNeeded();
    await page.screenshot({ path: join(TEST_OUTPUT, 'outputs-ration-check-360.png') });
    await page.close();
  });

  test('share: the advisor shares a ration check, the mail arrives, its link opens for the farm and answers not found elsewhere', async () => {
    const page = await browser.newPage({ viewport: WIDE });
    await signInThroughForm(page, t.server.baseUrl, 'advisor@upperwend.example', DEMO_PASSWORD);
    await page.goto(`${t.server.baseUrl}/ration-check`);
    await page.getByText('Broiler starter, 0–3 weeks').first().click();
    await visible(page, 'ration-name-0').fill('Maize from the store');
    await visible(page, 'ration-amount-0').fill('700');
    await visible(page, 'ration-price-0').fill('0.229');
    await visible(page, 'ration-value-0-lys').fill('0.26');
    await visible(page, 'ration-name-1').fill('Soybean meal');
    await visible(page, 'ration-amount-1').fill('300');
    await visible(page, 'ration-price-1').fill('0.512');
    await visible(page, 'ration-value-1-lys').fill('2.96');
    await visible(page, 'ration-submit').click();
    await visible(page, 'share-card').waitFor();
    await visible(page, 'share-note').fill('Add soybean meal before the next batch.');
    await visible(page, 'share-submit').click();
    await visible(page, 'share-done').waitFor();
    await page.close();

    const mail = await waitForMail(t.inbox, (m) => m.to.includes('farmer@orrinhollow.example') && /Ration check/.test(m.subject));
    assert.equal(mail.attachments.length, 1);
    assert.match(mail.attachments[0].filename, /\.csv$/);
    const link = /(http:\/\/\S+\/shared\/[A-Za-z0-9_-]+)/.exec(mail.text)?.[1];
    assert.ok(link, 'the mail carries a link');

    const farmer = await browser.newPage({ viewport: NARROW_PHONE });
    await signInThroughForm(farmer, t.server.baseUrl, 'farmer@orrinhollow.example', DEMO_PASSWORD);
    await farmer.goto(link!);
    await visible(farmer, 'shared-from').waitFor();
    await farmer.getByText(/Lysine, total is short/).first().waitFor();
    await farmer.getByText('Add soybean meal before the next batch.').waitFor();
    assert.equal(await visible(farmer, 'caution-banner').count(), 1);
    await farmer.screenshot({ path: join(TEST_OUTPUT, 'outputs-shared-farm-360.png'), fullPage: true });
    await farmer.close();

    const stranger = await browser.newPage({ viewport: WIDE });
    await signInThroughForm(stranger, t.server.baseUrl, 'keeper@lowerwend.example', FIXTURE_PASSWORD);
    await stranger.goto(link!);
    await visible(stranger, 'shared-not-found').waitFor();
    assert.equal(await stranger.getByText(/Lysine, total is short/).count(), 0);
    await stranger.close();
  });
});
