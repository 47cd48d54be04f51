import assert from 'node:assert/strict';
import { join } from 'node:path';
import { after, before, describe, test } from 'node:test';
import { and, eq, isNull } from 'drizzle-orm';
import type { Browser, Page } from 'playwright-core';

import { DEMO_PASSWORD } from '../../server/db/demo/accounts';
import { createSupplyPlan } from '../../server/db/queries/supply-plans';
import { formulas, ingredients, organizations, users } from '../../server/db/schema';
import { seedDemoData } from '../../server/db/seed';
import { WEB_DIST } from '../../server/index';
import { createSupplyPlanInput } from '../../src/shared/schemas/supply';
import { signedInClient, type Client } from '../helpers/accounts';
import { startTestApp, type TestApp } from '../helpers/app';
import { launchBrowser, signInThroughForm, TEST_OUTPUT, WIDE } from '../helpers/browser';

const visible = (page: Page, testId: string) => page.locator(`[data-testid="${testId}"]:visible`);
const OWNER = 'owner@tamsby.example';

// Check values from the definitions of the units, not from the code under test:
// 1 lb (avoirdupois) = 0.45359237 kg exactly, and 1 short ton = 2,000 lb = 907.18474 kg exactly
// (NIST Special Publication 811, 2008 edition, Appendix B.8, "pound (avoirdupois)" and "ton, short";
// recalled from memory). A price of 1 per lb is therefore 1 / 0.45359237 = 2.2046226218... per kg.
const LB_KG = 0.45359237;
const SHORT_TON_KG = 907.18474;
const ONE_PER_LB_IN_PER_KG = 2.2046226218487757;

const close = (actual: number, expected: number, rel: number, what: string) =>
  assert.ok(Math.abs(actual - expected) <= rel * Math.abs(expected), `${what}: ${actual} is not ${expected} (relative ${rel})`);

/** An owner switches the demo mill to US units and US dollars; the workspace, the library and the insect supply follow. */
describe('US units and currency in the browser', () => {
  let t: TestApp;
  let browser: Browser;
  let api: Client;
  const ids: Record<string, number> = {};

  before(async () => {
    t = await startTestApp('e2e_us_units', { webDist: WEB_DIST });
    const db = t.database.db;
    await seedDemoData(db);
    const [mill] = await db.select().from(organizations).where(eq(organizations.name, 'Tamsby Cooperative Feed Mill'));
    const [owner] = await db.select().from(users).where(eq(users.email, OWNER));
    const [refMaize] = await db.select().from(ingredients).where(and(isNull(ingredients.organizationId), eq(ingredients.code, 'maize')));
    ids.maize = (await db.select().from(ingredients).where(and(eq(ingredients.organizationId, mill.id), eq(ingredients.copiedFromId, refMaize.id))))[0].id;
    ids.grower = (await db.select().from(formulas).where(eq(formulas.name, 'Broiler grower with larvae meal')))[0].id;
    // The mill rears a little larvae of its own in this test: 2 t of brewery grains a week.
    await createSupplyPlan(db, mill.id, owner.id, createSupplyPlanInput.parse({ name: 'Mill rearing trial', streams: [{ name: 'Brewery grains', substrate: 'brewery_grains', tonnesPerWeek: 2 }] }));
    api = await signedInClient(t.server.baseUrl, OWNER, DEMO_PASSWORD);
    browser = await launchBrowser();
  });
  after(async () => {
    await browser?.close();
    await t?.close();
  });

  test('at 1280 px: the owner sets US units and USD; lb per batch, cost per short ton, prices per lb stored per kg, supply in short tons', async () => {
    const page = await browser.newPage({ viewport: WIDE });
    await signInThroughForm(page, t.server.baseUrl, OWNER, DEMO_PASSWORD);

    // Account: the owner's card.
    await page.goto(`${t.server.baseUrl}/account`);
    await visible(page, 'settings-card').waitFor();
    await visible(page, 'settings-units-us').click();
    await visible(page, 'settings-currency').fill('USD');
    await visible(page, 'settings-save').click();
    await visible(page, 'settings-saved').waitFor();
    const settings = await api.call('GET', '/api/organization-settings');
    assert.equal(settings.status, 200);
    assert.deepEqual({ unitSystem: (settings.body as { unitSystem: string }).unitSystem, currency: (settings.body as { currency: string }).currency }, { unitSystem: 'us', currency: 'USD' });
    await visible(page, 'settings-card').screenshot({ path: join(TEST_OUTPUT, 'us-units-settings.png') });

    // Workspace: the demo batch of 2,000 kg reads in lb; the solve's cost per tonne reads per short ton.
    await page.goto(`${t.server.baseUrl}/?formula=${ids.grower}`);
    await visible(page, 'screen-formula').waitFor();
    close(Number(await visible(page, 'input-batch').inputValue()), 2000 / LB_KG, 1e-5, 'batch of 2,000 kg in lb');
    const solved = page.waitForResponse((r) => r.url().endsWith(`/api/formulas/${ids.grower}/solve`) && r.request().method() === 'POST');
    await visible(page, 'solve').click();
    const solveResponse = await solved;
    const sent = solveResponse.request().postDataJSON() as { inputs: { batchKg: number } };
    assert.equal(sent.inputs.batchKg, 2000, 'the untouched batch goes back to the API in kg, exactly');
    const body = (await solveResponse.json()) as { result: { status: string; costPerTonne: number; costPerBatch: number; mix: { id: string; kg: number }[] } };
    assert.equal(body.result.status, 'optimal');
    await visible(page, 'mix-table').waitFor();
    await visible(page, 'caution-banner').waitFor();
    const perShortTon = await visible(page, 'cost-per-tonne').innerText();
    const m = /^(\d+\.\d{2})\s+per short ton$/.exec(perShortTon.trim());
    assert.ok(m, `cost per short ton: ${perShortTon}`);
    close(Number(m[1]), (body.result.costPerTonne * SHORT_TON_KG) / 1000, 0.006 / Number(m[1]), 'cost per short ton');
    assert.match(await visible(page, 'result-cost').innerText(), /USD/);
    assert.match(await visible(page, 'cost-per-batch').innerText(), /per batch of 4409 lb/);
    const line = [...body.result.mix].sort((a, b) => b.kg - a.kg)[0];
    const row = await visible(page, `mix-row-${line.id}`).innerText();
    const lbShown = row.split(/\s+/).map(Number).filter((n) => Number.isFinite(n) && n > 0);
    assert.ok(lbShown.some((n) => Math.abs(n - line.kg / LB_KG) <= 0.051), `${row} shows ${line.kg} kg as ${(line.kg / LB_KG).toFixed(1)} lb`);
    assert.match(await visible(page, 'mix-table').innerText(), /lb per batch/);
    assert.match(await visible(page, 'ranging-table').innerText(), /USD per lb/);
    // Nutrient levels are concentrations: still per kg.
    assert.match(await visible(page, 'per-kg-note').innerText(), /per kg of feed/);
    await page.screenshot({ path: join(TEST_OUTPUT, 'us-units-workspace.png'), fullPage: true });
    await visible(page, 'mix-table').screenshot({ path: join(TEST_OUTPUT, 'us-units-mix.png') });

    // Library: prices per lb with the currency.
    const maize = (await api.call('GET', `/api/ingredients/${ids.maize}`)).body as { pricePerKg: number };
    await page.goto(`${t.server.baseUrl}/library`);
    await visible(page, 'ingredient-table').waitFor();
    assert.equal((await visible(page, 'price-unit').innerText()).trim(), 'USD per lb');
    assert.match(await visible(page, `ingredient-row-${ids.maize}`).innerText(), new RegExp((maize.pricePerKg * LB_KG).toFixed(4).replace('.', '\\.')));
    await page.screenshot({ path: join(TEST_OUTPUT, 'us-units-library.png'), fullPage: true });

    // Weekly prices: 1.00 USD per lb typed, sent and stored per kg.
    await page.goto(`${t.server.baseUrl}/library/prices`);
    await visible(page, 'screen-prices').waitFor();
    await visible(page, `price-${ids.maize}`).fill('1.00');
    const recorded = page.waitForRequest((r) => r.url().endsWith('/api/prices') && r.method() === 'POST');
    await visible(page, 'prices-save').click();
    const request = (await recorded).postDataJSON() as { items: { ingredientId: number; pricePerKg: number }[] };
    assert.deepEqual(request.items.map((i) => i.ingredientId), [ids.maize], 'only the changed price is sent');
    close(request.items[0].pricePerKg, ONE_PER_LB_IN_PER_KG, 1e-11, '1.00 USD/lb sent per kg');
    assert.match(await visible(page, 'prices-message').innerText(), /Saved 1 price/);
    const stored = (await api.call('GET', `/api/ingredients/${ids.maize}`)).body as { pricePerKg: number };
    // Prices keep ten decimals per kg, so the typed 1.00 per lb comes back as 1.00 per lb.
    close(stored.pricePerKg, ONE_PER_LB_IN_PER_KG, 1e-10, 'stored per kg');
    close(stored.pricePerKg * 0.45359237, 1, 1e-10, 'read back per lb');
    await page.screenshot({ path: join(TEST_OUTPUT, 'us-units-prices.png'), fullPage: true });

    // Insect supply: 2 t a week of brewery grains = 2,000 / 907.18474 = 2.2046 short tons.
    // The settings are held back on purpose: the page must wait for them, never show tonnes for a moment.
    await page.route('**/api/organization-settings', async (route) => {
      await new Promise((resolve) => setTimeout(resolve, 1500));
      await route.continue();
    });
    await page.goto(`${t.server.baseUrl}/insect-supply`);
    await visible(page, 'supply-plan').waitFor();
    assert.match(await visible(page, 'supply-total-in').innerText(), /^2\.20\s*short ton\/week$/);
    for (const id of ['supply-total-larvae', 'supply-total-meal', 'supply-total-frass']) {
      const text = await visible(page, id).innerText();
      assert.match(text, /(lb|short ton)\/week$/, `${id}: ${text}`);
      assert.doesNotMatch(text, /\bkg\b|\bt\/week/, `${id}: ${text}`);
    }
    await page.screenshot({ path: join(TEST_OUTPUT, 'us-units-insect-supply.png'), fullPage: true });
    await page.close();
  });
});
