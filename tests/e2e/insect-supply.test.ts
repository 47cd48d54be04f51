import assert from 'node:assert/strict';
import { join } from 'node:path';
import { after, before, describe, test } from 'node:test';
import { and, eq, isNull } from 'drizzle-orm';
import type { Browser, Page } from 'playwright-core';

import { createApp } from '../../server/app';
import type { Db } from '../../server/db/client';
import { createSupplyPlan } from '../../server/db/queries/supply-plans';
import { ingredientNutrientValues, ingredients, ingredientValueSets, species, specificationNutrients, specifications } from '../../server/db/schema';
import { REFERENCE_LIBRARY_STEP, seedDemoData } from '../../server/db/seed';
import { WEB_DIST } from '../../server/index';
import { createSupplyPlanInput } from '../../src/shared/schemas/supply';
import { FIXTURE_PASSWORD, createOrganization, createUser } from '../helpers/accounts';
import { launchBrowser, PHONE, signInThroughForm, TEST_OUTPUT, WIDE } from '../helpers/browser';
import { createTestDatabase, type TestDatabase } from '../helpers/db';
import { listen, type TestServer } from '../helpers/http';

const visible = (page: Page, testId: string) => page.locator(`[data-testid="${testId}"]:visible`);

async function ownIngredient(db: Db, organizationId: number, name: string, price: number, cp: number) {
  const [{ id }] = await db.insert(ingredients).values({ organizationId, name, category: 'cereal_grain', pricePerKg: price.toFixed(4) }).$returningId();
  const [{ id: setId }] = await db.insert(ingredientValueSets).values({ ingredientId: id, sourceKind: 'estimate', sourceName: 'Test values', confidence: 'verified', dryMatterPct: 90 }).$returningId();
  await db.insert(ingredientNutrientValues).values([{ ingredientId: id, nutrientId: 'cp', valueSetId: setId, value: cp }]);
  return id;
}

async function proteinSpec(db: Db, organizationId: number, speciesCode: string, name: string) {
  const [s] = await db.select().from(species).where(and(isNull(species.organizationId), eq(species.code, speciesCode)));
  const [{ id }] = await db.insert(specifications).values({ organizationId, speciesId: s.id, name, source: 'Test: protein only' }).$returningId();
  await db.insert(specificationNutrients).values({ specificationId: id, nutrientId: 'cp', min: 20 });
  return id;
}

describe('insect supply in the browser', () => {
  let database: TestDatabase;
  let server: TestServer;
  let browser: Browser;
  let broilerSpec: number;
  let pigSpec: number;

  before(async () => {
    database = await createTestDatabase('e2e_supply');
    const db = database.db;
    await seedDemoData(db, [REFERENCE_LIBRARY_STEP]);
    const org = await createOrganization(db, 'Supply Test Farm', 'farm');
    const user = await createUser(db, { email: 'supply@example.org', organizationId: org.id, role: 'owner' });
    await ownIngredient(db, org.id, 'Test filler grain', 0.2, 0);
    await ownIngredient(db, org.id, 'Test protein meal', 0.5, 40);
    broilerSpec = await proteinSpec(db, org.id, 'broiler', 'Test broiler feed');
    pigSpec = await proteinSpec(db, org.id, 'grow-finish-pig', 'Test pig feed');
    // Chicken slaughter by-products: flagged by feed law, and the meal may not go to poultry.
    await createSupplyPlan(
      db,
      org.id,
      user.id,
      createSupplyPlanInput.parse({
        name: 'Test rearing week',
        streams: [
          { name: 'Brewery grains', substrate: 'brewery_grains', tonnesPerWeek: 6 },
          { name: 'Chicken trimmings', substrate: 'slaughter_by_products', tonnesPerWeek: 1, animals: ['chicken'] },
        ],
      }),
    );
    server = await listen(createApp({ db, webDist: WEB_DIST }));
    browser = await launchBrowser();
  });
  after(async () => {
    await browser?.close();
    await server?.close();
    await database?.drop();
  });

  for (const [label, viewport] of [['phone', PHONE], ['wide', WIDE]] as const) {
    test(`on ${label === 'phone' ? 'a 375 px phone' : 'a 1280 px screen'}: the plan, the flagged substrate and the blocked species`, async () => {
      const page = await browser.newPage({ viewport });
      await signInThroughForm(page, server.baseUrl, 'supply@example.org', FIXTURE_PASSWORD);
      await page.goto(`${server.baseUrl}/insect-supply`);
      await visible(page, 'supply-plan').waitFor();
      await visible(page, 'supply-flow-chart').waitFor();
      const meal = await visible(page, 'supply-total-meal').innerText();
      assert.match(meal, /\d.*(kg|t)\/week/, `meal shows a mass with its unit: ${meal}`);
      assert.ok(await visible(page, 'flow-larvae').count(), 'the chart has a fresh-larvae box');
      assert.match(await visible(page, 'flag-1').innerText(), /Chicken trimmings: not allowed in EU/);
      assert.match(await visible(page, 'species-rule').innerText(), /Never offered to poultry/);
      await page.screenshot({ path: join(TEST_OUTPUT, `insect-supply-${label}-plan.png`), fullPage: true });

      await visible(page, `alloc-spec-${broilerSpec}`).click();
      await visible(page, `alloc-tonnes-${broilerSpec}`).fill('1');
      await visible(page, `alloc-spec-${pigSpec}`).click();
      await visible(page, `alloc-tonnes-${pigSpec}`).fill('1');
      await visible(page, 'alloc-meal-price').fill('0.3');
      await visible(page, 'alloc-run').click();
      await visible(page, 'alloc-result').waitFor();
      assert.match(await visible(page, `alloc-refusal-${broilerSpec}`).innerText(), /Meal not offered: .*Broiler chicken/);
      assert.equal(await visible(page, `alloc-refusal-${pigSpec}`).count(), 0, 'the pig feed is offered the meal');
      assert.ok(await page.locator('[data-testid="alloc-result"] [data-testid="caution-banner"]:visible').count(), 'the caution banner sits on the result');
      assert.match(await visible(page, 'alloc-used').innerText(), /(kg|t)\/week/);
      await visible(page, `alloc-formula-${broilerSpec}`).scrollIntoViewIfNeeded();
      await page.screenshot({ path: join(TEST_OUTPUT, `insect-supply-${label}-allocation.png`), fullPage: true });
      const scrollWidth = await page.evaluate(() => document.documentElement.scrollWidth);
      assert.ok(scrollWidth <= viewport.width, `page is ${scrollWidth} px wide at ${viewport.width} px`);
      await page.close();
    });
  }

  test('editing a stream through the form changes the estimate, and a bad entry says what to fix', async () => {
    const page = await browser.newPage({ viewport: WIDE });
    await signInThroughForm(page, server.baseUrl, 'supply@example.org', FIXTURE_PASSWORD);
    await page.goto(`${server.baseUrl}/insect-supply`);
    const before = await visible(page, 'supply-total-in').innerText();
    await visible(page, 'plan-edit').click();
    await visible(page, 'stream-0-tonnes').fill('-2');
    await visible(page, 'plan-save').click();
    await visible(page, 'stream-0-tonnes-error').waitFor();
    await visible(page, 'stream-0-tonnes').fill('9');
    await visible(page, 'plan-save').click();
    await visible(page, 'supply-plan-form').waitFor({ state: 'detached' });
    const after = await visible(page, 'supply-total-in').innerText();
    assert.notEqual(after, before);
    assert.match(after, /10\.00\s*t\/week/);
    await page.close();
  });
});
