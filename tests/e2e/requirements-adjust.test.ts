import assert from 'node:assert/strict';
import { join } from 'node:path';
import { after, before, describe, test } from 'node:test';
import type { Browser, Page } from 'playwright-core';

import { REFERENCE_LIBRARY_STEP, seedDemoData } from '../../server/db/seed';
import { WEB_DIST } from '../../server/index';
import { createOrganization, createUser, FIXTURE_PASSWORD, signedInClient } from '../helpers/accounts';
import { startTestApp, type TestApp } from '../helpers/app';
import { launchBrowser, PHONE, signInThroughForm, TEST_OUTPUT, WIDE } from '../helpers/browser';

const EMAIL = 'nutritionist@hallowmere.example';
const OPERATOR = 'operator@hallowmere.example';
const visible = (page: Page, testId: string) => page.locator(`[data-testid="${testId}"]:visible`);

describe('adjusting a copied specification', () => {
  let t: TestApp;
  let browser: Browser;

  before(async () => {
    t = await startTestApp('e2e_requirements', { webDist: WEB_DIST });
    await seedDemoData(t.database.db, [REFERENCE_LIBRARY_STEP]);
    const org = await createOrganization(t.database.db, 'Hallowmere Mill');
    await createUser(t.database.db, { email: EMAIL, organizationId: org.id, role: 'nutritionist' });
    await createUser(t.database.db, { email: OPERATOR, organizationId: org.id, role: 'mill_operator' });
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
  test('on a phone: add a species and a phase, hear that a taken name is taken, then start a specification for the phase', async () => {
    const page = await browser.newPage({ viewport: PHONE });
    await signInThroughForm(page, t.server.baseUrl, EMAIL, FIXTURE_PASSWORD);
    await page.goto(`${t.server.baseUrl}/requirements`);
    await visible(page, 'species-open').click();
    await visible(page, 'screen-species').waitFor();

    // Nothing typed: each field says what it needs.
    await visible(page, 'species-submit').click();
    await page.locator('text=Name the species, e.g. Japanese quail.').first().waitFor();
    await visible(page, 'species-family-error').waitFor();

    // A name someone else took after the page was opened: the server's answer shows under the name.
    const api = await signedInClient(t.server.baseUrl, EMAIL);
    assert.equal((await api.call('POST', '/api/species', { name: 'Guinea fowl', family: 'poultry' })).status, 201);
    await visible(page, 'species-name').fill('guinea fowl');
    await visible(page, 'species-family-poultry').click();
    await visible(page, 'species-submit').click();
    await page.locator('[data-testid="species-name-error"]:visible', { hasText: 'is already in the list of your species' }).waitFor();

    await visible(page, 'species-name').fill('Japanese quail');
    await visible(page, 'species-submit').click();
    await visible(page, 'species-added').waitFor();
    await page.screenshot({ path: join(TEST_OUTPUT, 'requirements-species-added-phone.png') });

    // The phase form now points at the new species; a band that ends before it starts is refused.
    await visible(page, 'phase-name').fill('Starter');
    await visible(page, 'phase-from').fill('3');
    await visible(page, 'phase-to').fill('0');
    await visible(page, 'phase-submit').click();
    await page.locator('text=The phase must end after it starts.').first().waitFor();
    await visible(page, 'phase-from').fill('0');
    await visible(page, 'phase-to').fill('3');
    await visible(page, 'phase-submit').click();
    await visible(page, 'phase-added').waitFor();
    await page.locator('[data-testid="species-list"]:visible', { hasText: '0–3 weeks' }).waitFor();

    // The same phase name again, in another case: refused before anything is sent.
    await visible(page, 'phase-name').fill('STARTER');
    await visible(page, 'phase-from').fill('3');
    await visible(page, 'phase-submit').click();
    await page.locator('text=This species already has a phase with this name: choose another name.').first().waitFor();
    await page.screenshot({ path: join(TEST_OUTPUT, 'requirements-species-phone.png'), fullPage: true });

    // A specification of our own for the new phase, with its first bound.
    await visible(page, 'spec-start-source').fill('Our nutritionist, from trial results');
    await visible(page, 'spec-start-submit').click();
    await visible(page, 'screen-specification').waitFor();
    await visible(page, 'spec-edit').click();
    await visible(page, 'spec-add-search').fill('crude protein');
    await visible(page, 'spec-add-cp').click();
    await visible(page, 'bound-min-cp').fill('24');
    await visible(page, 'spec-save').click();
    await visible(page, 'bound-cp').waitFor();

    const id = Number(new URL(page.url()).pathname.split('/').pop());
    const { body } = await api.call('GET', `/api/specifications/${id}`);
    assert.deepEqual([body.species.name, body.phase.name, body.phase.span, body.library], ['Japanese quail', 'Starter', '0–3 weeks', 'own']);
    assert.deepEqual(body.bounds.map((b: { nutrientId: string; min: number }) => [b.nutrientId, b.min]), [['cp', 24]]);
    const quail = (await api.call('GET', '/api/species')).body.items.find((s: { name: string }) => s.name === 'Japanese quail');
    assert.deepEqual([quail.phases[0].ageFromDays, quail.phases[0].ageToDays], [0, 21]);
    await page.close();
  });

  test('on a phone: add a phase to broilers, start it from the reference grower specification, see its lysine bound, adjust one bound and save', async () => {
    const api = await signedInClient(t.server.baseUrl, EMAIL);
    const reference = (await api.call('GET', '/api/specifications?library=reference&pageSize=200')).body.items.find((s: { name: string }) => s.name === 'Broiler grower, 3–6 weeks');
    const grower = (await api.call('GET', `/api/specifications/${reference.id}`)).body;
    const lysine = grower.bounds.find((b: { nutrientId: string }) => b.nutrientId === 'lys');
    // The reference names its source as the NRC (1994) broiler table as adapted in the Merck Veterinary Manual
    // table “Nutrient Requirements of Broilers”, with no table number; there, lysine for 3–6 weeks is 1.00 % of the diet.
    assert.match(grower.source, /^NRC \(1994\) Nutrient Requirements of Poultry, broiler table, as adapted in the Merck Veterinary Manual/);
    assert.equal(lysine.min, 1.0);

    const page = await browser.newPage({ viewport: PHONE });
    await signInThroughForm(page, t.server.baseUrl, EMAIL, FIXTURE_PASSWORD);
    await page.goto(`${t.server.baseUrl}/requirements/species`);
    await visible(page, 'phase-form').waitFor();
    await visible(page, `phase-species-${grower.species.id}`).click();
    await visible(page, 'phase-name').fill('Finisher 35 d+');
    await visible(page, 'phase-band-age').click();
    await visible(page, 'phase-age-unit-days').click();
    await visible(page, 'phase-from').fill('35');
    await visible(page, 'phase-submit').click();
    await visible(page, 'phase-added').waitFor();

    // Next to the empty start: a copy of an existing specification. Only poultry ones are offered.
    await visible(page, 'spec-start').waitFor();
    await visible(page, 'spec-start-copy').waitFor();
    const pigSpec = (await api.call('GET', '/api/specifications?library=reference&pageSize=200')).body.items.find((s: { species: { family: string } }) => s.species.family === 'swine');
    assert.equal(await visible(page, `spec-start-copy-source-${pigSpec.id}`).count(), 0, 'no pig specification for a broiler phase');
    await visible(page, 'spec-start-copy-submit').click();
    await page.locator('[data-testid="spec-start-copy-source-error"]:visible', { hasText: 'Choose the specification to start from.' }).waitFor();
    await visible(page, `spec-start-copy-source-${grower.id}`).click();
    await visible(page, 'spec-start-copy-chosen').waitFor();
    await visible(page, 'spec-start-copy').screenshot({ path: join(TEST_OUTPUT, 'requirements-start-from-existing-phone.png') });
    await visible(page, 'spec-start-copy-name').fill('Broiler finisher from 35 days');
    await visible(page, 'spec-start-copy-submit').click();

    // The copy opens with its bounds form: the same lysine minimum as the reference holds.
    await visible(page, 'spec-bounds-form').waitFor();
    assert.equal(Number(await visible(page, 'bound-min-lys').inputValue()), lysine.min);
    await page.locator('[data-testid="screen-specification"]:visible', { hasText: 'Copied from “Broiler grower, 3–6 weeks”' }).waitFor();
    await visible(page, 'bound-min-lys').fill('0.95');
    await page.screenshot({ path: join(TEST_OUTPUT, 'requirements-copy-into-phase-phone.png'), fullPage: true });
    await visible(page, 'spec-save').click();
    await visible(page, 'bound-lys').waitFor();

    const id = Number(new URL(page.url()).pathname.split('/').pop());
    const { body } = await api.call('GET', `/api/specifications/${id}`);
    assert.deepEqual([body.species.id, body.phase.name, body.name, body.copiedFromId, body.source], [grower.species.id, 'Finisher 35 d+', 'Broiler finisher from 35 days', grower.id, grower.source]);
    assert.equal(body.bounds.find((b: { nutrientId: string }) => b.nutrientId === 'lys').min, 0.95);
    // Every other bound is still the reference's, confidence included.
    const others = (bounds: { nutrientId: string }[]) => bounds.filter((b) => b.nutrientId !== 'lys');
    assert.deepEqual(others(body.bounds), others(grower.bounds));
    assert.deepEqual(body.caps, grower.caps);
    await page.close();
  });

  test('at 1280 px: “Copy into another phase” offers the phases of poultry species only, grouped by species, and opens the copy ready to adjust', async () => {
    const api = await signedInClient(t.server.baseUrl, EMAIL);
    const items = (await api.call('GET', '/api/specifications?library=reference&pageSize=200')).body.items;
    const grower = items.find((s: { name: string }) => s.name === 'Broiler grower, 3–6 weeks');
    const allSpecies = (await api.call('GET', '/api/species')).body.items as { id: number; name: string; family: string; phases: { id: number; name: string }[] }[];
    const broiler = allSpecies.find((s) => s.id === grower.species.id)!;
    const target = broiler.phases.find((p) => p.name === 'Finisher 35 d+')!;
    const pigPhase = allSpecies.find((s) => s.family === 'swine')!.phases[0];

    const page = await browser.newPage({ viewport: WIDE });
    await signInThroughForm(page, t.server.baseUrl, EMAIL, FIXTURE_PASSWORD);
    await page.goto(`${t.server.baseUrl}/requirements/${grower.id}`);
    await visible(page, 'spec-copy-to').click();
    await visible(page, `spec-copy-phase-group-${broiler.id}`).waitFor();
    assert.equal(await visible(page, `spec-copy-phase-${pigPhase.id}`).count(), 0, 'no pig phase for a poultry specification');
    await visible(page, `spec-copy-phase-${target.id}`).click();
    await visible(page, 'spec-copy-moved').waitFor();
    assert.equal(await visible(page, 'spec-copy-name').inputValue(), 'Broiler chicken, Finisher 35 d+ (from Broiler grower, 3–6 weeks)');
    await visible(page, 'spec-copy-name').fill('');
    await visible(page, 'spec-copy-submit').click();
    await page.locator('text=Give the copy a name.').first().waitFor();
    await visible(page, 'spec-copy-name').fill('Finisher band, second try');
    await page.screenshot({ path: join(TEST_OUTPUT, 'requirements-copy-into-phase-wide.png'), fullPage: true });
    await visible(page, 'spec-copy-submit').click();
    await visible(page, 'spec-bounds-form').waitFor();
    const id = Number(new URL(page.url()).pathname.split('/').pop());
    const { body } = await api.call('GET', `/api/specifications/${id}`);
    assert.deepEqual([body.phase.id, body.name, body.copiedFromId], [target.id, 'Finisher band, second try', grower.id]);
    await page.close();
  });

  test('at 1280 px the forms and the list of species sit side by side; a role that cannot write sees the list only', async () => {
    const page = await browser.newPage({ viewport: WIDE });
    await signInThroughForm(page, t.server.baseUrl, EMAIL, FIXTURE_PASSWORD);
    await page.goto(`${t.server.baseUrl}/requirements/species`);
    const form = await visible(page, 'species-form').boundingBox();
    const list = await visible(page, 'species-list').boundingBox();
    assert.ok(form && list && list.x > form.x + form.width - 1, 'the list is to the right of the forms');
    await page.screenshot({ path: join(TEST_OUTPUT, 'requirements-species-wide.png'), fullPage: true });
    await page.close();

    const reader = await browser.newPage({ viewport: PHONE });
    await signInThroughForm(reader, t.server.baseUrl, OPERATOR, FIXTURE_PASSWORD);
    await reader.goto(`${t.server.baseUrl}/requirements/species`);
    await visible(reader, 'species-list').waitFor();
    assert.equal(await visible(reader, 'species-form').count(), 0);
    assert.equal(await visible(reader, 'phase-form').count(), 0);
    await reader.close();
  });
});
