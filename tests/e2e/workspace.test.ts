import assert from 'node:assert/strict';
import { join } from 'node:path';
import { after, before, describe, test } from 'node:test';
import { and, eq, isNotNull, isNull } from 'drizzle-orm';
import type { Browser, Page } from 'playwright-core';

import { DEMO_PASSWORD } from '../../server/db/demo/accounts';
import { createFormula, keepVersion } from '../../server/db/queries/formulas';
import { formulas, formulaVersions, ingredients, organizations, specifications, users } from '../../server/db/schema';
import { seedDemoData } from '../../server/db/seed';
import { createFormulaInput } from '../../src/shared/schemas/formulas';
import { WEB_DIST } from '../../server/index';
import { startTestApp, type TestApp } from '../helpers/app';
import { launchBrowser, PHONE, signInThroughForm, TEST_OUTPUT, WIDE } from '../helpers/browser';

const visible = (page: Page, testId: string) => page.locator(`[data-testid="${testId}"]:visible`);
const NUTRITIONIST = 'nutritionist@tamsby.example';
const OPERATOR = 'operator@tamsby.example';

/** The formula workspace in Chromium on the demo scenario, at phone and wide sizes, with screenshots. */
describe('formula workspace in the browser', () => {
  let t: TestApp;
  let browser: Browser;
  const ids: Record<string, number> = {};

  before(async () => {
    t = await startTestApp('e2e_workspace', { webDist: WEB_DIST });
    const db = t.database.db;
    await seedDemoData(db);
    const [mill] = await db.select().from(organizations).where(eq(organizations.name, 'Tamsby Cooperative Feed Mill'));
    const [refGrower] = await db.select().from(specifications).where(and(isNull(specifications.organizationId), eq(specifications.code, 'nrc1994-broiler-grower')));
    ids.grower = (await db.select().from(specifications).where(and(eq(specifications.organizationId, mill.id), eq(specifications.copiedFromId, refGrower.id))))[0].id;
    for (const code of ['maize', 'soybean-meal-48', 'soybean-oil', 'limestone', 'dicalcium-phosphate', 'salt', 'l-lysine-hcl', 'dl-methionine', 'l-threonine']) {
      const [ref] = await db.select().from(ingredients).where(and(isNull(ingredients.organizationId), eq(ingredients.code, code)));
      ids[code] = (await db.select().from(ingredients).where(and(eq(ingredients.organizationId, mill.id), eq(ingredients.copiedFromId, ref.id))))[0].id;
    }
    ids.meal = (await db.select().from(ingredients).where(and(eq(ingredients.organizationId, mill.id), eq(ingredients.name, 'Larvae meal, partially defatted (Orrin Hollow contract)'))))[0].id;
    ids.demoGrower = (await db.select().from(formulas).where(eq(formulas.name, 'Broiler grower with larvae meal')))[0].id;
    ids.demoFinisher = (await db.select().from(formulas).where(eq(formulas.name, 'Broiler finisher without added fat')))[0].id;
    ids.mill = mill.id;
    browser = await launchBrowser();
  });
  after(async () => {
    await browser?.close();
    await t?.close();
  });

  test('at 1280 px: build a broiler grower from the demo library, solve, see mix, chart and caution; make it infeasible and read the advice', async () => {
    const page = await browser.newPage({ viewport: WIDE });
    await signInThroughForm(page, t.server.baseUrl, NUTRITIONIST, DEMO_PASSWORD);
    await page.screenshot({ path: join(TEST_OUTPUT, 'workspace-wide-list.png'), fullPage: true });
    await visible(page, 'new-formula').click();
    await visible(page, 'new-formula-name').fill('Browser broiler grower');
    await visible(page, `new-formula-spec-${ids.grower}`).click();
    for (const code of ['maize', 'soybean-meal-48', 'soybean-oil', 'limestone', 'dicalcium-phosphate', 'salt', 'l-lysine-hcl', 'dl-methionine', 'l-threonine']) {
      await visible(page, `pick-${ids[code]}`).click();
    }
    // Insect meals are one chip away.
    await visible(page, 'picker-filter-insect').click();
    await visible(page, `pick-${ids.meal}`).click();
    await page.screenshot({ path: join(TEST_OUTPUT, 'workspace-wide-new-formula.png'), fullPage: true });
    await visible(page, 'new-formula-submit').click();
    await visible(page, 'screen-formula').waitFor();
    assert.match(new URL(page.url()).search, /formula=\d+/);

    await visible(page, 'solve').click();
    await visible(page, 'mix-table').waitFor();
    await visible(page, 'nutrient-chart').waitFor();
    await visible(page, 'caution-banner').waitFor();
    assert.match(await visible(page, 'cost-per-tonne').innerText(), /^\d+\.\d{2}\s+per tonne$/);
    assert.ok((await page.locator('[data-testid^="mix-row-"]:visible').count()) >= 3, 'a mix of several ingredients');
    assert.ok((await page.locator('[data-testid="shadow-price"]:visible').count()) >= 1, 'binding bounds explained');
    assert.match(await visible(page, 'formula-result').innerText(), /as fed/);
    // Wide: inputs on the left, results on the right.
    const inputs = await visible(page, 'formula-inputs').boundingBox();
    const result = await visible(page, 'formula-result').boundingBox();
    assert.ok(inputs && result && inputs.x + inputs.width <= result.x + 1, 'inputs sit left of the results');
    await page.screenshot({ path: join(TEST_OUTPUT, 'workspace-wide-result.png'), fullPage: true });

    // Energy above any ingredient's: no mix can exist.
    await visible(page, 'bound-amen_poultry-min').fill('9000');
    await visible(page, 'solve').click();
    await visible(page, 'infeasible-advice').waitFor();
    const advice = await visible(page, 'infeasible-advice').innerText();
    assert.match(advice, /AMEn/);
    assert.ok((await page.locator('[data-testid="relaxation"]:visible').count()) >= 1, 'the advice is in sentences, never an empty table');
    await visible(page, 'caution-banner').waitFor();
    assert.equal(await visible(page, 'bound-amen_poultry-min').inputValue(), '9000', 'inputs kept');
    await page.screenshot({ path: join(TEST_OUTPUT, 'workspace-wide-infeasible.png'), fullPage: true });
    assert.doesNotMatch(advice, /nutrients\[/, 'bounds named in words, not engine paths');
    await page.close();
  });

  test('at 375 px: the demo larvae meal formula solves, mix and chart stack, and the insect meal value chart shows where it enters', async () => {
    const page = await browser.newPage({ viewport: PHONE });
    await signInThroughForm(page, t.server.baseUrl, NUTRITIONIST, DEMO_PASSWORD);
    await visible(page, `formula-${ids.demoGrower}`).click();
    await visible(page, 'screen-formula').waitFor();
    await visible(page, 'solve').click();
    await visible(page, 'solve-working').waitFor({ state: 'detached' }).catch(() => undefined);
    await visible(page, 'nutrient-chart').waitFor();
    const mix = await visible(page, 'mix-table').boundingBox();
    const chart = await visible(page, 'nutrient-chart').boundingBox();
    assert.ok(mix && chart && chart.y >= mix.y + mix.height - 1, 'on a phone the chart sits under the mix');
    assert.match(await visible(page, `mix-row-${ids.meal}`).innerText(), /insect meal/);
    await page.screenshot({ path: join(TEST_OUTPUT, 'workspace-phone-result.png'), fullPage: true });
    await visible(page, 'mix-table').screenshot({ path: join(TEST_OUTPUT, 'workspace-phone-mix.png') });
    await visible(page, 'nutrient-chart').screenshot({ path: join(TEST_OUTPUT, 'workspace-phone-nutrient-chart.png') });
    await visible(page, 'insect-sweep').click();
    await visible(page, 'price-sweep-chart').waitFor();
    // The meal is in the demo mix at today's price: the sentence says so and where it would leave, never "enters" as if it were out.
    const enters = await visible(page, 'insect-enters').innerText();
    const said = enters.match(/is already in the mix at today’s price of (\d+\.\d{3}) EUR per kg\. It stays in up to (\d+\.\d{3}) EUR per kg; above that it is left out\./);
    assert.ok(said, enters);
    assert.ok(Number(said[2]) > Number(said[1]), `stays in up to ${said[2]}, above today’s ${said[1]}`);
    await visible(page, 'sweep-enters-marker').waitFor();
    const scrollWidth = await page.evaluate(() => document.documentElement.scrollWidth);
    assert.ok(scrollWidth <= PHONE.width, `page is ${scrollWidth} px wide at ${PHONE.width} px`);
    await visible(page, 'insect-value').screenshot({ path: join(TEST_OUTPUT, 'workspace-phone-insect-value.png') });
    await page.close();
  });

  test('a nutritionist approves a version; the mill operator sees it, with the caution, and nothing else', async () => {
    const page = await browser.newPage({ viewport: WIDE });
    await signInThroughForm(page, t.server.baseUrl, NUTRITIONIST, DEMO_PASSWORD);
    await page.goto(`${t.server.baseUrl}/?formula=${ids.demoGrower}`);
    await visible(page, 'screen-formula').waitFor();
    await visible(page, 'approve-version-1').click();
    await page.locator('[data-testid="version-1"]:visible', { hasText: 'the mill uses this one' }).waitFor();
    await visible(page, 'keep-version').click();
    await visible(page, 'version-2').waitFor();
    await visible(page, 'compare-result').waitFor();
    assert.match(await visible(page, 'compare-result').innerText(), /Cost per tonne: A/);
    await visible(page, 'versions-panel').screenshot({ path: join(TEST_OUTPUT, 'workspace-wide-versions.png') });
    // The infeasible demo formula cannot be approved: no approve button on its version.
    await page.goto(`${t.server.baseUrl}/?formula=${ids.demoFinisher}`);
    await visible(page, 'infeasible-advice').waitFor();
    assert.equal(await page.locator('[data-testid="approve-version-1"]:visible').count(), 0);
    await page.close();

    const op = await browser.newPage({ viewport: PHONE });
    await signInThroughForm(op, t.server.baseUrl, OPERATOR, DEMO_PASSWORD);
    await visible(op, 'approved-list').waitFor();
    await visible(op, `approved-${ids.demoGrower}`).waitFor();
    const listed = await op.locator('[data-testid^="approved-"]:visible').allInnerTexts();
    assert.ok(!listed.join(' ').includes('without added fat'), 'an unapproved formula never reaches the mill');
    await op.screenshot({ path: join(TEST_OUTPUT, 'workspace-phone-operator-list.png'), fullPage: true });
    await visible(op, `approved-${ids.demoGrower}`).click();
    await visible(op, 'screen-batch-sheet-page').waitFor();
    await visible(op, 'sheet-table').waitFor();
    await visible(op, 'caution-banner').waitFor();
    assert.match(await visible(op, 'sheet-table').innerText(), /larvae meal/i);
    await op.screenshot({ path: join(TEST_OUTPUT, 'workspace-phone-batch-sheet.png'), fullPage: true });
    // The print of the sheet keeps the caution.
    await op.emulateMedia({ media: 'print' });
    assert.ok(await visible(op, 'caution-banner').isVisible());
    await op.close();
  });

  test('at 375 px: a draft is deleted after a second, inline step that says what goes; at 1280 px an approved formula says what holds it', async () => {
    const db = t.database.db;
    const [idris] = await db.select().from(users).where(eq(users.email, NUTRITIONIST));
    const draftInput = createFormulaInput.parse({ name: 'Grower draft to drop', specificationId: ids.grower, ingredients: ['maize', 'soybean-meal-48', 'soybean-oil', 'limestone', 'dicalcium-phosphate', 'salt', 'l-lysine-hcl', 'dl-methionine', 'l-threonine'].map((code) => ({ ingredientId: ids[code] })) });
    const draftId = await createFormula(db, ids.mill, idris.id, draftInput);
    await keepVersion(db, ids.mill, idris.id, draftId, undefined, 'first try');

    const page = await browser.newPage({ viewport: PHONE });
    await signInThroughForm(page, t.server.baseUrl, NUTRITIONIST, DEMO_PASSWORD);
    await visible(page, `formula-${draftId}`).waitFor();
    await page.goto(`${t.server.baseUrl}/?formula=${draftId}`);
    await visible(page, 'screen-formula').waitFor();
    // First step: nothing is deleted yet; the card says exactly what would go.
    await visible(page, 'remove-formula').click();
    await visible(page, 'remove-formula-consequence').waitFor();
    assert.equal(
      await visible(page, 'remove-formula-consequence').innerText(),
      'Deleting “Grower draft to drop” removes it for good with its current inputs and its 1 kept version (none approved, none shared, no batch recorded). This cannot be undone.',
    );
    assert.match(await visible(page, 'remove-formula-card').innerText(), /Delete “Grower draft to drop”\?/);
    const scrollWidth = await page.evaluate(() => document.documentElement.scrollWidth);
    assert.ok(scrollWidth <= PHONE.width, `page is ${scrollWidth} px wide at ${PHONE.width} px`);
    const confirm = await visible(page, 'remove-formula-confirm').boundingBox();
    assert.ok(confirm && confirm.height >= 48, 'the confirming button is a full touch target');
    await visible(page, 'remove-formula-card').screenshot({ path: join(TEST_OUTPUT, 'workspace-phone-remove-confirm.png') });
    // Keep it: the card closes and the formula is untouched.
    await visible(page, 'remove-formula-cancel').click();
    await visible(page, 'remove-formula-card').waitFor({ state: 'detached' });
    assert.equal((await db.select().from(formulas).where(eq(formulas.id, draftId))).length, 1);
    // Second time through: delete it. The list says so and no longer shows it; its version went with it.
    await visible(page, 'remove-formula').click();
    await visible(page, 'remove-formula-confirm').click();
    await visible(page, 'formula-removed').waitFor();
    assert.equal(await visible(page, 'formula-removed').innerText(), '“Grower draft to drop” was deleted with its kept versions.');
    assert.equal(await page.locator(`[data-testid="formula-${draftId}"]:visible`).count(), 0);
    assert.equal((await db.select().from(formulas).where(eq(formulas.id, draftId))).length, 0);
    assert.equal((await db.select().from(formulaVersions).where(eq(formulaVersions.formulaId, draftId))).length, 0);
    await page.screenshot({ path: join(TEST_OUTPUT, 'workspace-phone-removed.png'), fullPage: true });
    await page.close();

    // An approved formula: the same first step tells what holds it, and offers no delete.
    const [approved] = await db.select({ formulaId: formulaVersions.formulaId }).from(formulaVersions).where(and(eq(formulaVersions.organizationId, ids.mill), isNotNull(formulaVersions.approvedAt)));
    const wide = await browser.newPage({ viewport: WIDE });
    await signInThroughForm(wide, t.server.baseUrl, NUTRITIONIST, DEMO_PASSWORD);
    await wide.goto(`${t.server.baseUrl}/?formula=${approved.formulaId}`);
    await visible(wide, 'screen-formula').waitFor();
    await visible(wide, 'remove-formula').click();
    await visible(wide, 'remove-formula-held').waitFor();
    assert.match(await visible(wide, 'remove-formula-held').innerText(), /cannot be deleted: version \d+ is the approved version the mill makes batches from[\s\S]*must keep working[\s\S]*• Version \d+, approved by .*: the mill makes batches from it/);
    assert.equal(await wide.locator('[data-testid="remove-formula-confirm"]:visible').count(), 0, 'no way to delete it');
    await visible(wide, 'remove-formula-card').screenshot({ path: join(TEST_OUTPUT, 'workspace-wide-remove-held.png') });
    await visible(wide, 'remove-formula-cancel').click();
    await visible(wide, 'remove-formula-card').waitFor({ state: 'detached' });
    assert.equal((await db.select().from(formulas).where(eq(formulas.id, approved.formulaId))).length, 1);
    await wide.close();
  });

  test('at 1280 px: the nutritionist archives the demo’s approved formula instead of deleting it, finds it under Archived, read-only, and restores it', async () => {
    const db = t.database.db;
    const [starter] = await db.select().from(formulas).where(eq(formulas.name, 'Broiler starter'));
    const page = await browser.newPage({ viewport: WIDE });
    await signInThroughForm(page, t.server.baseUrl, NUTRITIONIST, DEMO_PASSWORD);
    await visible(page, `formula-${starter.id}`).click();
    await visible(page, 'screen-formula').waitFor();
    await visible(page, 'remove-formula').click();
    await visible(page, 'remove-formula-held').waitFor();
    assert.match(await visible(page, 'remove-formula-archive-offer').innerText(), /^Archive “Broiler starter” instead: it leaves the formula list and the mill’s list of approved formulas and becomes read-only/);
    await visible(page, 'remove-formula-card').screenshot({ path: join(TEST_OUTPUT, 'workspace-wide-archive-offer.png') });
    await visible(page, 'remove-formula-archive').click();

    // Back on the list: it says where the formula went, and the formula is no longer there.
    await visible(page, 'formula-archived').waitFor();
    assert.match(await visible(page, 'formula-archived').innerText(), /^“Broiler starter” was archived: .*Find it under “Archived”/);
    await visible(page, 'formula-shelf').waitFor();
    assert.equal(await page.locator(`[data-testid="formula-${starter.id}"]:visible`).count(), 0, 'gone from the working list');
    assert.ok((await db.select().from(formulas).where(eq(formulas.id, starter.id)))[0].archivedAt);

    // Under Archived: who archived it, and Restore. Opened, it is read-only with a banner.
    await visible(page, 'formula-shelf-archived').click();
    await visible(page, `archived-formula-${starter.id}`).waitFor();
    assert.match(await visible(page, `archived-formula-${starter.id}`).innerText(), /Archived by Idris Okonjo/);
    await page.screenshot({ path: join(TEST_OUTPUT, 'workspace-wide-archived-list.png'), fullPage: true });
    await visible(page, `formula-${starter.id}`).click();
    await visible(page, 'archived-banner').waitFor();
    assert.match(await visible(page, 'archived-banner').innerText(), /Archived: read-only[\s\S]*Batch sheets already handed out, the batch log and links shared with farms still work/);
    await visible(page, 'mix-table').waitFor();
    await visible(page, 'caution-banner').waitFor();
    for (const gone of ['solve', 'keep-version', 'save-inputs', 'approve-version-1']) assert.equal(await page.locator(`[data-testid="${gone}"]:visible`).count(), 0, `no ${gone} on an archived formula`);
    await visible(page, 'restore-formula').waitFor();
    await page.screenshot({ path: join(TEST_OUTPUT, 'workspace-wide-archived-formula.png'), fullPage: true });

    // Restored from the list: back among the formulas in use.
    await visible(page, 'back-to-formulas').click();
    await visible(page, 'formula-shelf-archived').click();
    await visible(page, `restore-formula-${starter.id}`).click();
    await visible(page, 'formula-restored').waitFor();
    assert.match(await visible(page, 'formula-restored').innerText(), /^“Broiler starter” was restored/);
    await visible(page, `archived-formula-${starter.id}`).waitFor({ state: 'detached' });
    await visible(page, 'formula-shelf-in-use').click();
    await visible(page, `formula-${starter.id}`).waitFor();
    assert.equal((await db.select().from(formulas).where(eq(formulas.id, starter.id)))[0].archivedAt, null);
    await page.screenshot({ path: join(TEST_OUTPUT, 'workspace-wide-restored.png'), fullPage: true });
    await page.close();
  });
});
