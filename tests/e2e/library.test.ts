import assert from 'node:assert/strict';
import { join } from 'node:path';
import { after, before, describe, test } from 'node:test';
import type { Browser, Page } from 'playwright-core';

import { and, eq, isNull } from 'drizzle-orm';

import { createFormula } from '../../server/db/queries/formulas';
import { createIngredient } from '../../server/db/queries/ingredients';
import { copySpecification } from '../../server/db/queries/specifications';
import { copyIngredientsToOrganization } from '../../server/db/reference-data/seed-library';
import { ingredients, specifications } from '../../server/db/schema';
import { REFERENCE_LIBRARY_STEP, seedDemoData } from '../../server/db/seed';
import { WEB_DIST } from '../../server/index';
import { createFormulaInput } from '../../src/shared/schemas/formulas';
import { createIngredientInput } from '../../src/shared/schemas/ingredients';
import { createOrganization, createUser, FIXTURE_PASSWORD } from '../helpers/accounts';
import { startTestApp, type TestApp } from '../helpers/app';
import { launchBrowser, PHONE, signInThroughForm, TEST_OUTPUT, WIDE } from '../helpers/browser';

const visible = (page: Page, testId: string) => page.locator(`[data-testid="${testId}"]:visible`);
const EMAIL = 'nutritionist@lowfield.example';

describe('library and requirements in the browser', () => {
  let t: TestApp;
  let browser: Browser;
  let usedMaize: number;
  let unusedCake: number;

  before(async () => {
    t = await startTestApp('e2e_library', { webDist: WEB_DIST });
    const db = t.database.db;
    await seedDemoData(db, [REFERENCE_LIBRARY_STEP]);
    const org = await createOrganization(db, 'Lowfield Mill');
    const user = await createUser(db, { email: EMAIL, organizationId: org.id, role: 'nutritionist' });
    await db.transaction((tx) => copyIngredientsToOrganization(tx as unknown as typeof db, org.id));
    // A formula that uses the mill's maize, so deleting the maize is refused; the rapeseed cake nothing uses.
    const own = async (code: string) => {
      const [ref] = await db.select().from(ingredients).where(and(isNull(ingredients.organizationId), eq(ingredients.code, code)));
      return (await db.select().from(ingredients).where(and(eq(ingredients.organizationId, org.id), eq(ingredients.copiedFromId, ref.id))))[0].id;
    };
    usedMaize = await own('maize');
    const [starter] = await db.select().from(specifications).where(and(isNull(specifications.organizationId), eq(specifications.code, 'nrc1994-broiler-starter')));
    const spec = await copySpecification(db, org.id, starter.id, 'Lowfield starter');
    await createFormula(db, org.id, user.id, createFormulaInput.parse({ name: 'Lowfield broiler starter', specificationId: spec, ingredients: [{ ingredientId: usedMaize }, { ingredientId: await own('soybean-meal-48') }] }));
    unusedCake = await createIngredient(db, org.id, user.id, createIngredientInput.parse({ name: 'Rapeseed cake, old lot', category: 'oilseed_meal', values: { cp: 34 }, source: { kind: 'estimate', name: 'Supplier sheet', dryMatterPct: 87 } }));
    browser = await launchBrowser();
  });
  after(async () => {
    await browser?.close();
    await t?.close();
  });

  test('at 375 px: cards, an ingredient’s profile on as-fed and dry-matter bases, nothing wider than the screen', async () => {
    const page = await browser.newPage({ viewport: PHONE });
    await signInThroughForm(page, t.server.baseUrl, EMAIL, FIXTURE_PASSWORD);
    await page.goto(`${t.server.baseUrl}/library`);
    await visible(page, 'ingredient-cards').waitFor();
    assert.equal(await page.locator('[data-testid="ingredient-table"]:visible').count(), 0, 'no table on a phone');
    await visible(page, 'ingredient-search').fill('maize');
    const card = page.locator('[data-testid^="ingredient-card-"]:visible').first();
    await page.waitForFunction(() => document.querySelectorAll('[data-testid^="ingredient-card-"]').length === 1);
    const box = await card.boundingBox();
    assert.ok(box && box.height >= 48, 'a card is a comfortable touch target');
    await card.click();
    await visible(page, 'screen-ingredient').waitFor();
    // Corn 8.5 % CP as fed at 89 % DM is 9.55 % of the dry matter (value × 100 / DM).
    assert.match(await visible(page, 'value-cp-figure').innerText(), /^8\.50\s/);
    await visible(page, 'basis-dry_matter').click();
    assert.match(await visible(page, 'value-cp-figure').innerText(), /^9\.55\s/);
    assert.match(await visible(page, 'value-sources').innerText(), /NRC \(2012\)/);
    await visible(page, 'caution-banner').waitFor();
    const scrollWidth = await page.evaluate(() => document.documentElement.scrollWidth);
    assert.ok(scrollWidth <= PHONE.width, `page is ${scrollWidth} px wide at ${PHONE.width} px`);
    await page.screenshot({ path: join(TEST_OUTPUT, 'library-ingredient-phone.png'), fullPage: true });

    await page.goto(`${t.server.baseUrl}/library/prices`);
    await visible(page, 'screen-prices').waitFor();
    const inputs = page.locator('input[data-testid^="price-"]:visible');
    await inputs.nth(0).fill('-2');
    await visible(page, 'prices-save').click();
    assert.match(await page.locator('text=Enter a price of 0 or more').first().innerText(), /0 or more/);
    await inputs.nth(0).fill('0.241');
    await inputs.nth(1).fill('0,498');
    await visible(page, 'prices-save').click();
    assert.match(await visible(page, 'prices-message').innerText(), /Saved 2 prices/);
    await page.close();
  });

  test('at 1280 px: a table; a reference specification copied and adjusted; an edit form that says what to fix', async () => {
    const page = await browser.newPage({ viewport: WIDE });
    await signInThroughForm(page, t.server.baseUrl, EMAIL, FIXTURE_PASSWORD);
    await page.goto(`${t.server.baseUrl}/library`);
    await visible(page, 'ingredient-table').waitFor();
    await visible(page, 'category-insect_meal').click();
    await page.waitForFunction(() => document.querySelector('[data-testid="ingredient-count"]')?.textContent?.startsWith('7 '));
    await page.screenshot({ path: join(TEST_OUTPUT, 'library-table-wide.png') });

    await page.goto(`${t.server.baseUrl}/requirements`);
    await visible(page, 'screen-requirements').waitFor();
    await visible(page, 'spec-table').waitFor();
    await page.locator('[data-testid^="spec-row-"]:visible', { hasText: 'Broiler starter' }).click();
    await visible(page, 'screen-specification').waitFor();
    // NRC 1994 broiler starter: CP 23.00 %, Lys 1.10 % (Merck Veterinary Manual table adapted from NRC 1994).
    assert.match(await visible(page, 'bound-cp').innerText(), /23\.00/);
    assert.match(await visible(page, 'bound-lys').innerText(), /1\.10/);
    assert.match(await visible(page, 'spec-caps').innerText(), /Dabbou et al\. 2018/);
    await visible(page, 'spec-copy').click();
    await visible(page, 'spec-edit').waitFor();
    await visible(page, 'spec-edit').click();
    await visible(page, 'bound-min-lys').fill('1.28');
    await visible(page, 'bound-max-lys').fill('1.2');
    await visible(page, 'spec-save').click();
    await page.locator('text=The maximum must not be below the minimum.').first().waitFor();
    await visible(page, 'bound-max-lys').fill('');
    await visible(page, 'spec-save').click();
    await visible(page, 'bound-lys').waitFor();
    assert.match(await visible(page, 'bound-lys').innerText(), /Set by us[\s\S]*1\.28/);

    await page.goto(`${t.server.baseUrl}/library/new`);
    await visible(page, 'screen-ingredient-form').waitFor();
    await visible(page, 'field-value-cp').fill('abc');
    await visible(page, 'ingredient-save').click();
    await visible(page, 'form-invalid').waitFor();
    assert.match(await visible(page, 'field-name-error').innerText(), /name/);
    assert.match(await visible(page, 'field-value-cp-error').innerText(), /number/);
    await visible(page, 'field-name').fill('Oats, local');
    await visible(page, 'field-value-cp').fill('10.6');
    await visible(page, 'field-source-name').fill('Supplier sheet, March');
    await visible(page, 'field-source-dm').fill('88');
    await visible(page, 'ingredient-save').click();
    await visible(page, 'screen-ingredient').waitFor();
    assert.match(await visible(page, 'value-cp-figure').innerText(), /^10\.60\s/);
    // A lab report on a dry-matter basis is stored as fed: 12 % CP in DM at 88 % DM = 10.56 % as fed.
    await visible(page, 'lab-name').fill('County feed lab, report 31');
    await visible(page, 'lab-dm').fill('88');
    await visible(page, 'lab-basis-dry_matter').click();
    await visible(page, 'lab-value-cp').fill('12');
    await visible(page, 'lab-save').click();
    await visible(page, 'lab-message').waitFor();
    assert.match(await visible(page, 'value-cp-figure').innerText(), /^10\.56\s/);
    assert.match(await visible(page, 'value-sources').innerText(), /County feed lab, report 31/);
    await page.screenshot({ path: join(TEST_OUTPUT, 'library-new-ingredient-wide.png'), fullPage: true });
    await page.close();
  });

  test('at 1280 px: deleting asks to confirm, names the formula that still uses an ingredient, and returns to the library', async () => {
    const page = await browser.newPage({ viewport: WIDE });
    await signInThroughForm(page, t.server.baseUrl, EMAIL, FIXTURE_PASSWORD);

    await page.goto(`${t.server.baseUrl}/library/${usedMaize}`);
    await visible(page, 'screen-ingredient').waitFor();
    await visible(page, 'ingredient-delete').click();
    await visible(page, 'delete-confirm').waitFor();
    await visible(page, 'delete-confirm-yes').click();
    await visible(page, 'delete-refused').waitFor();
    assert.match(await visible(page, 'delete-refused').innerText(), /was not deleted: it is used in the formula “Lowfield broiler starter”[\s\S]*Formula: Lowfield broiler starter/);
    await page.screenshot({ path: join(TEST_OUTPUT, 'library-delete-refused-wide.png'), fullPage: true });
    await visible(page, 'delete-confirm-no').click();
    await visible(page, 'delete-confirm').waitFor({ state: 'detached' });
    assert.equal(await visible(page, 'screen-ingredient').count(), 1, 'still on the ingredient');

    await page.goto(`${t.server.baseUrl}/library`);
    await visible(page, 'ingredient-table').waitFor();
    await visible(page, 'ingredient-search').fill('rapeseed cake, old');
    await visible(page, `ingredient-row-${unusedCake}`).click();
    await visible(page, 'screen-ingredient').waitFor();
    // The first step only asks; keeping it changes nothing.
    await visible(page, 'ingredient-delete').click();
    assert.match(await visible(page, 'delete-confirm').innerText(), /Delete “Rapeseed cake, old lot”\?[\s\S]*kept are not changed/);
    await visible(page, 'delete-confirm-no').click();
    await visible(page, 'ingredient-delete').click();
    await visible(page, 'delete-confirm-yes').click();
    await visible(page, 'screen-library').waitFor();
    await visible(page, 'ingredient-table').waitFor();
    await page.waitForFunction((id) => !document.querySelector(`[data-testid="ingredient-row-${id}"]`), unusedCake);
    const gone = await fetch(`${t.server.baseUrl}/api/ingredients/${unusedCake}`, { headers: { cookie: (await page.context().cookies()).map((c) => `${c.name}=${c.value}`).join('; ') } });
    assert.equal(gone.status, 404);
    await page.close();
  });
});
