import assert from 'node:assert/strict';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { after, before, describe, test } from 'node:test';
import type { Browser, Page } from 'playwright-core';

import { REFERENCE_LIBRARY_STEP, seedDemoData } from '../../server/db/seed';
import { WEB_DIST } from '../../server/index';
import { createOrganization, createUser, FIXTURE_PASSWORD } from '../helpers/accounts';
import { startTestApp, type TestApp } from '../helpers/app';
import { launchBrowser, PHONE, signInThroughForm, TEST_OUTPUT } from '../helpers/browser';

const FIXTURES = fileURLToPath(new URL('../fixtures/lab/', import.meta.url));
const visible = (page: Page, testId: string) => page.locator(`[data-testid="${testId}"]:visible`);

describe('lab import in the browser', () => {
  let t: TestApp;
  let browser: Browser;

  before(async () => {
    t = await startTestApp('e2e_lab_import', { webDist: WEB_DIST });
    await seedDemoData(t.database.db, [REFERENCE_LIBRARY_STEP]);
    const org = await createOrganization(t.database.db, 'Hollow Larvae Farm', 'farm');
    await createUser(t.database.db, { email: 'advisor@hollow.example', name: 'Advisor Person', organizationId: org.id, role: 'advisor' });
    browser = await launchBrowser();
  });
  after(async () => {
    await browser?.close();
    await t?.close();
  });

  test('on a phone: upload, correct the mapping, see both bases and estimates, override, save, compare', async () => {
    const page = await browser.newPage({ viewport: PHONE });
    await signInThroughForm(page, t.server.baseUrl, 'advisor@hollow.example', FIXTURE_PASSWORD);
    await page.goto(`${t.server.baseUrl}/lab-import`);
    await visible(page, 'screen-lab-import').waitFor();
    await visible(page, 'lab-name').fill('Wend Feed Lab');
    await page.locator('[data-testid="lab-file-input"]').first().setInputFiles(join(FIXTURES, 'sample-per-row.csv'));
    await visible(page, 'sample-OH-0312').waitFor();

    // Both bases: Ca 21.5 g/kg as fed is 2.15 %, and 2.15 × 100 / 92.4 = 2.327 % of dry matter (shown to two decimals).
    assert.match(await visible(page, 'asfed-OH-0312-ca').innerText(), /^2\.15\s*%/);
    assert.match(await visible(page, 'dm-OH-0312-ca').innerText(), /^2\.33\s*%/);
    await page.screenshot({ path: join(TEST_OUTPUT, 'lab-import-preview-phone.png'), fullPage: true });

    // The kind of ingredient brings digestible amino acids, marked as estimated with the coefficient named.
    await page.locator('[data-testid="estimation-class"]:visible').selectOption('bsf_partially_defatted');
    await visible(page, 'value-OH-0312-dig_lys').waitFor();
    assert.match(await visible(page, 'value-OH-0312-dig_lys').innerText(), /Estimated: Partially defatted BSF meal, broilers/);

    // Correct a mapping: cystine not imported, so Met + Cys is no longer calculated.
    assert.equal(await visible(page, 'value-OH-0312-metcys').count(), 1);
    const cystineRow = page.locator('[data-testid^="map-row-"]:visible', { hasText: 'Cystine %' });
    await cystineRow.locator('select').first().selectOption('ignore');
    await visible(page, 'value-OH-0312-metcys').waitFor({ state: 'detached' });

    // Override an estimate.
    await visible(page, 'override-OH-0312-dig_lys').fill('2.1');
    await visible(page, 'override-OH-0312-dig_lys').press('Enter');
    await page.locator('[data-testid="value-OH-0312-dig_lys"]:visible', { hasText: 'Entered' }).waitFor();
    assert.match(await visible(page, 'asfed-OH-0312-dig_lys').innerText(), /^2\.1\s*%/);
    await visible(page, 'caution-banner').first().waitFor();

    // Save both samples as new insect-meal ingredients.
    await page.locator('[data-testid="new-category"]:visible').selectOption('insect_meal');
    await visible(page, 'new-substrate').fill('brewery spent grains');
    await visible(page, 'save-import').click();
    await visible(page, 'import-saved').waitFor();
    assert.match(await visible(page, 'import-saved').innerText(), /New ingredient “Larvae meal, brewery grains”, sample OH-0312, analysed 2026-03-12/);
    await page.screenshot({ path: join(TEST_OUTPUT, 'lab-import-saved-phone.png'), fullPage: true });

    // The new analysis, in the comparison view, on both bases.
    await page.locator('[data-testid^="history-"]:visible', { hasText: 'Compare its analyses' }).first().click();
    await visible(page, 'history-table').waitFor();
    assert.match(await visible(page, 'history-row-cp').innerText(), /41\.8 %/);
    assert.match(await visible(page, 'history-row-dig_lys').innerText(), /2\.1 %[\s\S]*entered/);
    await visible(page, 'history-basis-dry_matter').click();
    assert.match(await visible(page, 'history-row-cp').innerText(), /45\.24 %/);
    await page.screenshot({ path: join(TEST_OUTPUT, 'lab-analyses-history-phone.png'), fullPage: true });
    await page.close();
  });

  test('a broken file shows its problem by line and column and cannot be saved', async () => {
    const page = await browser.newPage({ viewport: PHONE });
    await signInThroughForm(page, t.server.baseUrl, 'advisor@hollow.example', FIXTURE_PASSWORD);
    await page.goto(`${t.server.baseUrl}/lab-import`);
    await page.locator('[data-testid="lab-file-input"]').first().setInputFiles(join(FIXTURES, 'formula-injection.csv'));
    await visible(page, 'lab-issues').waitFor();
    assert.match(await visible(page, 'lab-issues').innerText(), /Line 2, column “Comment”: .*spreadsheet formula/);
    assert.equal(await visible(page, 'save-import').getAttribute('aria-disabled'), 'true');
    await page.screenshot({ path: join(TEST_OUTPUT, 'lab-import-broken-phone.png'), fullPage: true });
    await page.locator('[data-testid="lab-file-input"]').first().setInputFiles(join(FIXTURES, 'missing-header.csv'));
    await page.locator('[data-testid="lab-issues"]:visible', { hasText: 'Add a header row' }).waitFor();
    await page.close();
  });
});
