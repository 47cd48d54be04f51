import assert from 'node:assert/strict';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { after, before, describe, test } from 'node:test';
import type { Browser, Page } from 'playwright-core';

import { createIngredient } from '../../server/db/queries/ingredients';
import { REFERENCE_FIBRE_STEP } from '../../server/db/reference-data/fibre-fractions';
import { REFERENCE_LIBRARY_STEP, seedDemoData } from '../../server/db/seed';
import { WEB_DIST } from '../../server/index';
import { createIngredientInput } from '../../src/shared/schemas/ingredients';
import { createOrganization, createUser, FIXTURE_PASSWORD } from '../helpers/accounts';
import { startTestApp, type TestApp } from '../helpers/app';
import { launchBrowser, PHONE, signInThroughForm, TEST_OUTPUT } from '../helpers/browser';

const FIXTURES = fileURLToPath(new URL('../fixtures/lab/', import.meta.url));
const visible = (page: Page, testId: string) => page.locator(`[data-testid="${testId}"]:visible`);

describe('lab import in the browser', () => {
  let t: TestApp;
  let browser: Browser;
  let meal: number;

  before(async () => {
    t = await startTestApp('e2e_lab_import', { webDist: WEB_DIST });
    await seedDemoData(t.database.db, [REFERENCE_LIBRARY_STEP, REFERENCE_FIBRE_STEP]);
    const org = await createOrganization(t.database.db, 'Hollow Larvae Farm', 'farm');
    const advisor = await createUser(t.database.db, { email: 'advisor@hollow.example', name: 'Advisor Person', organizationId: org.id, role: 'advisor' });
    meal = await createIngredient(t.database.db, org.id, advisor.id, createIngredientInput.parse({
      name: 'Larvae meal, market waste',
      category: 'insect_meal',
      insect: { species: 'hermetia_illucens', processing: 'full_fat', substrate: 'market vegetable waste', substrateOrigin: 'plant', substrateAnimals: [] },
      values: { cp: 38 },
      source: { kind: 'estimate', name: 'Supplier sheet', dryMatterPct: 92 },
    }));
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
    // With NDF and ADF in the catalogue, each is offered once, as a nutrient (not also as an estimate-only input).
    const choices = await cystineRow.locator('select').first().locator('option').allInnerTexts();
    assert.ok(choices.includes('Acid detergent fibre (ADF) (%)') && choices.includes('Neutral detergent fibre (NDF) (%)'), choices.join(' | '));
    assert.deepEqual(choices.filter((c) => /\b(ADF|NDF)\b/.test(c)).length, 2, choices.join(' | '));
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

  test('at 375 px: an analysis typed on the ingredient’s page shows in its analysis history, marked typed in, with the values', async () => {
    const page = await browser.newPage({ viewport: PHONE });
    await signInThroughForm(page, t.server.baseUrl, 'advisor@hollow.example', FIXTURE_PASSWORD);
    await page.goto(`${t.server.baseUrl}/library/${meal}`);
    await visible(page, 'screen-ingredient').waitFor();
    await visible(page, 'analysis-history-empty').waitFor();
    await visible(page, 'lab-name').fill('Upper Wend county lab');
    await visible(page, 'lab-sample').fill('R-88');
    await visible(page, 'lab-date').fill('2026-03-26');
    await visible(page, 'lab-dm').fill('93');
    await visible(page, 'lab-basis-dry_matter').click();
    await visible(page, 'lab-value-cp').fill('45');
    await visible(page, 'lab-value-ca').fill('2,4');
    await visible(page, 'lab-save').click();
    await page.locator('[data-testid="lab-message"]:visible', { hasText: 'recorded in the history' }).waitFor();
    assert.match(await visible(page, 'lab-message').innerText(), /Now in the library: dry matter, crude protein, calcium/);

    const entry = page.locator('[data-testid^="analysis-"][data-testid$="-entry"]:visible');
    await entry.waitFor();
    assert.match(await entry.innerText(), /Typed in by hand by Advisor Person on \d{4}-\d{2}-\d{2} · sample R-88/);
    const history = visible(page, 'analysis-history');
    assert.match(await history.innerText(), /2026-03-26 · Upper Wend county lab/);
    // On dry matter → as fed is arithmetic: 45 % × 93 / 100 = 41.85 % as fed.
    const cp = page.locator('[data-testid^="analysis-"][data-testid$="-cp"]:visible');
    assert.match(await cp.innerText(), /41\.85\s*% as fed/);
    assert.match(await visible(page, 'value-cp-figure').innerText(), /^41\.85\s/);
    await visible(page, 'basis-dry_matter').click();
    assert.match(await cp.innerText(), /45\.00\s*% of DM/);
    const scrollWidth = await page.evaluate(() => document.documentElement.scrollWidth);
    assert.ok(scrollWidth <= PHONE.width, `page is ${scrollWidth} px wide at ${PHONE.width} px`);
    await history.screenshot({ path: join(TEST_OUTPUT, 'ingredient-analysis-history-phone.png') });
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
