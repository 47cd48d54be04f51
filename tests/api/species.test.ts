import assert from 'node:assert/strict';
import { after, before, describe, test } from 'node:test';
import { and, count, eq, isNull } from 'drizzle-orm';

import { REFERENCE_PULLETS_STEP } from '../../server/db/reference-data/pullets';
import { phases, species } from '../../server/db/schema';
import { REFERENCE_LIBRARY_STEP, seedDemoData } from '../../server/db/seed';
import { createOrganization, createUser, signedInClient, type Client } from '../helpers/accounts';
import { startTestApp, type TestApp } from '../helpers/app';

type SpeciesBody = { id: number; name: string; family: string; library: string; phases: { id: number; name: string; span: string | null; ageFromDays: number | null; ageToDays: number | null; bodyWeightFromKg: number | null; bodyWeightToKg: number | null; library: string }[] };

describe('species API', () => {
  let app: TestApp;
  let nutritionist: Client;
  let operator: Client;
  let outsider: Client;
  let orgA: { id: number };
  let pullet: number;

  before(async () => {
    app = await startTestApp('species_api');
    const db = app.database.db;
    await seedDemoData(db, [REFERENCE_LIBRARY_STEP, REFERENCE_PULLETS_STEP]);
    orgA = await createOrganization(db, 'Species Test Mill');
    const orgB = await createOrganization(db, 'Species Test Farm', 'farm');
    await createUser(db, { email: 'nutri@species.example.org', organizationId: orgA.id, role: 'nutritionist' });
    await createUser(db, { email: 'operator@species.example.org', organizationId: orgA.id, role: 'mill_operator' });
    await createUser(db, { email: 'owner@species-b.example.org', organizationId: orgB.id, role: 'owner' });
    nutritionist = await signedInClient(app.server.baseUrl, 'nutri@species.example.org');
    operator = await signedInClient(app.server.baseUrl, 'operator@species.example.org');
    outsider = await signedInClient(app.server.baseUrl, 'owner@species-b.example.org');
    pullet = (await db.select().from(species).where(and(isNull(species.organizationId), eq(species.code, 'pullet'))))[0].id;
  });
  after(async () => app?.close());

  const speciesCount = async () => (await app.database.db.select({ n: count() }).from(species))[0].n;
  const phaseCount = async () => (await app.database.db.select({ n: count() }).from(phases))[0].n;

  describe('POST /api/species', () => {
    test('adds a species of the organization, listed after the reference species', async () => {
      const { status, body } = await nutritionist.call('POST', '/api/species', { name: '  Japanese quail ', family: 'poultry' });
      assert.equal(status, 201);
      assert.equal(body.name, 'Japanese quail');
      assert.equal(body.family, 'poultry');
      assert.equal(body.library, 'own');
      assert.deepEqual(body.phases, []);
      const list = await nutritionist.call('GET', '/api/species');
      const names = list.body.items.map((s: SpeciesBody) => s.name);
      assert.equal(names.at(-1), 'Japanese quail');
      assert.ok(names.includes('Pullet (replacement layer)'));
    });

    test('answers 409 with a message on the name field for a name already in the list, in any case, and adds nothing', async () => {
      const before = await speciesCount();
      const own = await nutritionist.call('POST', '/api/species', { name: 'JAPANESE QUAIL', family: 'poultry' });
      assert.equal(own.status, 409);
      assert.equal(own.body.error.code, 'duplicate_name');
      assert.match(own.body.error.message, /“Japanese quail” is already in the list of your species/);
      assert.match(own.body.error.fieldErrors.name[0], /choose another name/);
      const reference = await nutritionist.call('POST', '/api/species', { name: 'broiler chicken', family: 'poultry' });
      assert.equal(reference.status, 409);
      assert.match(reference.body.error.message, /“Broiler chicken” is already in the reference list/);
      assert.equal(await speciesCount(), before);
    });

    test('another organization may use the same name for its own species', async () => {
      const { status, body } = await outsider.call('POST', '/api/species', { name: 'Japanese quail', family: 'poultry' });
      assert.equal(status, 201);
      assert.equal(body.library, 'own');
      const mine = await nutritionist.call('GET', '/api/species');
      assert.equal(mine.body.items.filter((s: SpeciesBody) => s.name === 'Japanese quail').length, 1, 'B’s species is not listed in A');
    });

    test('two requests for the same new name at the same moment add it once', async () => {
      const before = await speciesCount();
      const answers = await Promise.all([1, 2, 3].map(() => nutritionist.call('POST', '/api/species', { name: 'Guinea fowl', family: 'poultry' })));
      assert.deepEqual(answers.map((a) => a.status).sort(), [201, 409, 409]);
      assert.equal(await speciesCount(), before + 1);
    });

    test('answers 400 naming the fields for a missing name or a family Troughline does not formulate for', async () => {
      const { status, body } = await nutritionist.call('POST', '/api/species', { name: '  ', family: 'cattle' });
      assert.equal(status, 400);
      assert.deepEqual(body.error.fieldErrors.name, ['name the species']);
      assert.deepEqual(body.error.fieldErrors.family, ['choose poultry or pigs']);
    });

    test('a mill operator may not add a species', async () => {
      const { status } = await operator.call('POST', '/api/species', { name: 'Turkey', family: 'poultry' });
      assert.equal(status, 403);
    });
  });

  describe('POST /api/species/:id/phases', () => {
    test('adds a phase with an age band to a reference species; it belongs to the organization only', async () => {
      const { status, body } = await nutritionist.call('POST', `/api/species/${pullet}/phases`, { name: 'Late pre-lay', span: '17–19 weeks', ageFromDays: 119, ageToDays: 133 });
      assert.equal(status, 201);
      const added = (body as SpeciesBody).phases.find((p) => p.name === 'Late pre-lay');
      assert.ok(added);
      assert.deepEqual([added.library, added.span, added.ageFromDays, added.ageToDays, added.bodyWeightFromKg], ['own', '17–19 weeks', 119, 133, null]);
      // The reference phases stay, with the pre-lay phase added to the library.
      assert.ok(body.phases.some((p: { name: string; library: string }) => p.name === 'Pre-lay' && p.library === 'reference'));
      const other = await outsider.call('GET', `/api/species/${pullet}`);
      assert.ok(!other.body.phases.some((p: { name: string }) => p.name === 'Late pre-lay'), 'the other organization does not see it');
    });

    test('adds a phase with a body-weight band to the organization’s own species', async () => {
      const created = await nutritionist.call('POST', '/api/species', { name: 'Local pig', family: 'swine' });
      assert.equal(created.status, 201);
      const { status, body } = await nutritionist.call('POST', `/api/species/${created.body.id}/phases`, { name: 'Weaner', span: '8–20 kg', bodyWeightFromKg: 8, bodyWeightToKg: 20 });
      assert.equal(status, 201);
      assert.deepEqual(body.phases.map((p: SpeciesBody['phases'][number]) => [p.name, p.bodyWeightFromKg, p.bodyWeightToKg, p.ageFromDays]), [['Weaner', 8, 20, null]]);
    });

    test('answers 409 for a phase name the species already has (its own or the reference one), and adds nothing', async () => {
      const before = await phaseCount();
      const own = await nutritionist.call('POST', `/api/species/${pullet}/phases`, { name: 'late PRE-LAY' });
      assert.equal(own.status, 409);
      assert.equal(own.body.error.code, 'duplicate_name');
      assert.match(own.body.error.fieldErrors.name[0], /already has a phase named “Late pre-lay” \(17–19 weeks\)/);
      const reference = await nutritionist.call('POST', `/api/species/${pullet}/phases`, { name: 'Grower', span: '6–12 weeks' });
      assert.equal(reference.status, 409);
      assert.match(reference.body.error.message, /Pullet \(replacement layer\) already has a phase named “Grower”/);
      assert.equal(await phaseCount(), before);
      // The same name on another species is fine.
      const broiler = (await nutritionist.call('GET', '/api/species')).body.items.find((s: SpeciesBody) => s.name === 'Broiler chicken');
      assert.equal((await nutritionist.call('POST', `/api/species/${broiler.id}/phases`, { name: 'Late pre-lay' })).status, 201);
    });

    test('answers 400 naming the field for a band that ends before it starts', async () => {
      const age = await nutritionist.call('POST', `/api/species/${pullet}/phases`, { name: 'Backwards', ageFromDays: 50, ageToDays: 20 });
      assert.equal(age.status, 400);
      assert.deepEqual(age.body.error.fieldErrors.ageToDays, ['the phase must end after it starts']);
      const weight = await nutritionist.call('POST', `/api/species/${pullet}/phases`, { name: 'Backwards', bodyWeightFromKg: 2, bodyWeightToKg: 1 });
      assert.equal(weight.status, 400);
      assert.ok(weight.body.error.fieldErrors.bodyWeightToKg);
    });

    test('answers 404 for a species of another organization, and adds nothing', async () => {
      const theirs = await outsider.call('POST', '/api/species', { name: 'Muscovy duck', family: 'poultry' });
      const before = await phaseCount();
      const { status } = await nutritionist.call('POST', `/api/species/${theirs.body.id}/phases`, { name: 'Starter' });
      assert.equal(status, 404);
      assert.equal(await phaseCount(), before);
    });
  });

  describe('a specification for a phase added here', () => {
    test('starts empty for the new phase, and bounds can then be set on it', async () => {
      const species = await nutritionist.call('POST', '/api/species', { name: 'Slow-growing broiler', family: 'poultry' });
      const withPhase = await nutritionist.call('POST', `/api/species/${species.body.id}/phases`, { name: 'Starter', span: '0–4 weeks', ageFromDays: 0, ageToDays: 28 });
      const phaseId = withPhase.body.phases[0].id;
      const created = await nutritionist.call('POST', '/api/specifications', { speciesId: species.body.id, phaseId, name: 'Slow-growing broiler, starter', source: 'Set by us', bounds: [] });
      assert.equal(created.status, 201);
      assert.deepEqual([created.body.species.id, created.body.phase.id, created.body.bounds.length], [species.body.id, phaseId, 0]);
      const adjusted = await nutritionist.call('PUT', `/api/specifications/${created.body.id}`, {
        speciesId: species.body.id,
        phaseId,
        name: 'Slow-growing broiler, starter',
        source: 'Set by us',
        bounds: [{ nutrientId: 'cp', min: 20 }],
        expectedVersion: created.body.version,
      });
      assert.equal(adjusted.status, 200);
      assert.deepEqual(adjusted.body.bounds.map((b: { nutrientId: string; min: number }) => [b.nutrientId, b.min]), [['cp', 20]]);
    });
  });
});
