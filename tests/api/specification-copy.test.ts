import assert from 'node:assert/strict';
import { after, before, describe, test } from 'node:test';
import { and, asc, count, eq, isNull } from 'drizzle-orm';

import { ingredients, phases, species, specificationCaps, specificationNutrients, specificationRatios, specifications } from '../../server/db/schema';
import { REFERENCE_LIBRARY_STEP, seedDemoData } from '../../server/db/seed';
import { createOrganization, createUser, signedInClient, type Client } from '../helpers/accounts';
import { startTestApp, type TestApp } from '../helpers/app';

type SpeciesBody = { id: number; name: string; phases: { id: number; name: string }[] };

describe('copying a specification into another phase', () => {
  let app: TestApp;
  let nutritionist: Client;
  let owner: Client;
  let operator: Client;
  let advisor: Client;
  let outsider: Client;
  const ref: Record<string, number> = {};

  before(async () => {
    app = await startTestApp('specification_copy_api');
    const db = app.database.db;
    await seedDemoData(db, [REFERENCE_LIBRARY_STEP]);
    const orgA = await createOrganization(db, 'Copy Test Mill');
    const orgB = await createOrganization(db, 'Copy Test Farm', 'farm');
    for (const [email, role] of [['nutri@copy.example.org', 'nutritionist'], ['owner@copy.example.org', 'owner'], ['operator@copy.example.org', 'mill_operator'], ['advisor@copy.example.org', 'advisor']] as const) {
      await createUser(db, { email, organizationId: orgA.id, role });
    }
    await createUser(db, { email: 'owner@copy-b.example.org', organizationId: orgB.id, role: 'owner' });
    nutritionist = await signedInClient(app.server.baseUrl, 'nutri@copy.example.org');
    owner = await signedInClient(app.server.baseUrl, 'owner@copy.example.org');
    operator = await signedInClient(app.server.baseUrl, 'operator@copy.example.org');
    advisor = await signedInClient(app.server.baseUrl, 'advisor@copy.example.org');
    outsider = await signedInClient(app.server.baseUrl, 'owner@copy-b.example.org');
    for (const code of ['nrc1994-broiler-grower', 'nrc1994-broiler-starter']) {
      ref[code] = (await db.select().from(specifications).where(and(isNull(specifications.organizationId), eq(specifications.code, code))))[0].id;
    }
    for (const code of ['broiler', 'grow-finish-pig']) ref[code] = (await db.select().from(species).where(and(isNull(species.organizationId), eq(species.code, code))))[0].id;
    ref.pigPhase = (await db.select().from(phases).where(eq(phases.speciesId, ref['grow-finish-pig'])).orderBy(asc(phases.id)))[0].id;
    ref.bsf = (await db.select().from(ingredients).where(and(isNull(ingredients.organizationId), eq(ingredients.code, 'bsf-full-fat-brewery'))))[0].id;
  });
  after(async () => app?.close());

  const specCount = async () => (await app.database.db.select({ n: count() }).from(specifications))[0].n;

  /** Every stored row of a specification, without its own ids, in insertion order. */
  async function storedRows(id: number) {
    const db = app.database.db;
    const bounds = await db.select().from(specificationNutrients).where(eq(specificationNutrients.specificationId, id)).orderBy(asc(specificationNutrients.id));
    const ratios = await db.select().from(specificationRatios).where(eq(specificationRatios.specificationId, id)).orderBy(asc(specificationRatios.id));
    const caps = await db.select().from(specificationCaps).where(eq(specificationCaps.specificationId, id)).orderBy(asc(specificationCaps.id));
    return {
      bounds: bounds.map(({ id: _id, specificationId: _s, ...row }) => row),
      ratios: ratios.map(({ id: _id, specificationId: _s, ...row }) => row),
      caps: caps.map(({ id: _id, specificationId: _s, ...row }) => row),
    };
  }

  async function addPhase(client: Client, speciesId: number, name: string, span: string): Promise<number> {
    const added = await client.call('POST', `/api/species/${speciesId}/phases`, { name, span });
    assert.equal(added.status, 201, JSON.stringify(added.body));
    return (added.body as SpeciesBody).phases.find((p) => p.name === name)!.id;
  }

  describe('POST /api/specifications/:id/copy with a phase', () => {
    test('a reference specification copied into a new phase of the same species keeps every bound, ratio and cap, row by row', async () => {
      const phaseId = await addPhase(nutritionist, ref.broiler, 'Finisher 35 d+', 'from 35 days');
      const source = (await nutritionist.call('GET', `/api/specifications/${ref['nrc1994-broiler-grower']}`)).body;
      const copy = await nutritionist.call('POST', `/api/specifications/${ref['nrc1994-broiler-grower']}/copy`, { phaseId, name: 'Our finisher from 35 days' });
      assert.equal(copy.status, 201, JSON.stringify(copy.body));
      assert.equal(copy.body.library, 'own');
      assert.equal(copy.body.name, 'Our finisher from 35 days');
      assert.deepEqual(copy.body.phase, { id: phaseId, name: 'Finisher 35 d+', span: 'from 35 days' });
      assert.equal(copy.body.species.id, ref.broiler);
      assert.equal(copy.body.copiedFromId, ref['nrc1994-broiler-grower'], 'the copy records its source');
      assert.equal(copy.body.source, source.source, 'the bounds still name the table they come from');
      assert.match(copy.body.notes, /^Copied from “Broiler grower, 3–6 weeks” \(Broiler chicken, Grower, 3–6 weeks\): its bounds were set for that phase/);
      assert.ok(copy.body.notes.endsWith(source.notes), 'the source’s own notes follow');

      // Row by row, as stored: nutrient, minimum, maximum, confidence and note; ratios; caps with their studies.
      const [from, to] = [await storedRows(ref['nrc1994-broiler-grower']), await storedRows(copy.body.id)];
      assert.ok(from.bounds.length >= 17 && from.ratios.length === 1 && from.caps.length === 3, 'the grower table has bounds, a ratio and three insect caps');
      assert.equal(to.bounds.length, from.bounds.length);
      from.bounds.forEach((row, i) => assert.deepEqual(to.bounds[i], row, `bound ${row.nutrientId}`));
      from.ratios.forEach((row, i) => assert.deepEqual(to.ratios[i], row, `ratio ${row.numeratorId}:${row.denominatorId}`));
      from.caps.forEach((row, i) => assert.deepEqual(to.caps[i], row, `cap ${row.insectSpecies ?? row.category ?? row.ingredientId}`));
      assert.deepEqual(copy.body.bounds, source.bounds);
      assert.deepEqual(copy.body.ratios, source.ratios);
      assert.deepEqual(copy.body.caps, source.caps);
      assert.ok(to.caps.some((c) => c.insectSpecies === 'hermetia_illucens' && c.maxPct === 10 && /Dabbou et al\. 2018/.test(c.source)), 'the insect meal cap keeps its cited study');

      // Lysine, 3–6 weeks: 1.00 % of the diet (NRC 1994 broiler table, as adapted in the Merck Veterinary
      // Manual table “Nutrient Requirements of Broilers”).
      assert.equal(copy.body.bounds.find((b: { nutrientId: string }) => b.nutrientId === 'lys').min, 1.0);
      // The reference phase keeps its own specification, untouched.
      assert.deepEqual(await storedRows(ref['nrc1994-broiler-grower']), from);
      assert.equal((await nutritionist.call('GET', `/api/specifications/${ref['nrc1994-broiler-grower']}`)).body.phase.name, 'Grower');
    });

    test('goes into a phase of another species of the same family, and an own specification with an ingredient cap keeps it', async () => {
      const turkey = await nutritionist.call('POST', '/api/species', { name: 'Turkey (copy test)', family: 'poultry' });
      assert.equal(turkey.status, 201);
      const poultPhase = await addPhase(nutritionist, turkey.body.id, 'Poult', '0–4 weeks');
      const meal = await nutritionist.call('POST', `/api/ingredients/${ref.bsf}/copy`, { name: 'Our larvae meal, brewery grains' });
      assert.equal(meal.status, 201);
      const own = await nutritionist.call('POST', `/api/specifications/${ref['nrc1994-broiler-starter']}/copy`, { name: 'Our starter' });
      const withCap = await nutritionist.call('PUT', `/api/specifications/${own.body.id}`, {
        speciesId: own.body.species.id,
        phaseId: own.body.phase.id,
        name: own.body.name,
        source: own.body.source,
        notes: own.body.notes,
        bounds: own.body.bounds.map((b: { nutrientId: string; min: number | null; max: number | null; note: string | null }) => ({ nutrientId: b.nutrientId, min: b.min, max: b.max, note: b.note })),
        ratios: own.body.ratios.map((r: { numeratorId: string; denominatorId: string; min: number | null; max: number | null; note: string | null }) => ({ numeratorId: r.numeratorId, denominatorId: r.denominatorId, min: r.min, max: r.max, note: r.note })),
        caps: [
          ...own.body.caps.map(({ ingredientName: _n, ...c }: { ingredientName: string | null }) => c),
          { scope: 'ingredient', ingredientId: meal.body.id, maxPct: 6, soft: false, source: 'Our own trial, 2025 flock', note: 'Held below the study level' },
        ],
        expectedVersion: own.body.version,
      });
      assert.equal(withCap.status, 200, JSON.stringify(withCap.body));

      const copy = await nutritionist.call('POST', `/api/specifications/${own.body.id}/copy`, { phaseId: poultPhase, name: 'Poult starter' });
      assert.equal(copy.status, 201, JSON.stringify(copy.body));
      assert.deepEqual([copy.body.species.name, copy.body.phase.name, copy.body.copiedFromId], ['Turkey (copy test)', 'Poult', own.body.id]);
      const [from, to] = [await storedRows(own.body.id), await storedRows(copy.body.id)];
      assert.deepEqual(to, from);
      assert.deepEqual(to.caps.at(-1), { scope: 'ingredient', ingredientId: meal.body.id, category: null, insectSpecies: null, minPct: null, maxPct: 6, soft: false, source: 'Our own trial, 2025 flock', note: 'Held below the study level' });
    });

    test('without a phase the copy keeps its source’s phase, as before; the same phase again is a plain copy', async () => {
      const plain = await nutritionist.call('POST', `/api/specifications/${ref['nrc1994-broiler-grower']}/copy`, {});
      assert.equal(plain.status, 201);
      assert.equal(plain.body.name, 'Broiler grower, 3–6 weeks');
      const reference = (await nutritionist.call('GET', `/api/specifications/${ref['nrc1994-broiler-grower']}`)).body;
      assert.equal(plain.body.phase.id, reference.phase.id);
      assert.equal(plain.body.notes, reference.notes);
      const same = await nutritionist.call('POST', `/api/specifications/${ref['nrc1994-broiler-grower']}/copy`, { phaseId: reference.phase.id });
      assert.equal(same.status, 201);
      assert.equal(same.body.notes, reference.notes);
      assert.deepEqual(await storedRows(same.body.id), await storedRows(ref['nrc1994-broiler-grower']));
    });

    test('names a copy by its new phase when no name is given', async () => {
      const phaseId = await addPhase(owner, ref.broiler, 'Heavy roaster', '8–10 weeks');
      const copy = await owner.call('POST', `/api/specifications/${ref['nrc1994-broiler-grower']}/copy`, { phaseId });
      assert.equal(copy.status, 201);
      assert.equal(copy.body.name, 'Broiler chicken, Heavy roaster (from Broiler grower, 3–6 weeks)');
    });

    test('refuses a pig phase for a poultry specification, saying why, and writes nothing', async () => {
      const before = await specCount();
      const { status, body } = await nutritionist.call('POST', `/api/specifications/${ref['nrc1994-broiler-grower']}/copy`, { phaseId: ref.pigPhase, name: 'Pig grower from broilers' });
      assert.equal(status, 400);
      assert.equal(body.error.code, 'family_mismatch');
      assert.match(body.error.message, /“Broiler grower, 3–6 weeks” is a poultry \(AMEn.*\) specification and Growing-finishing pig is a pig species/);
      assert.match(body.error.fieldErrors.phaseId[0], /Copy a pig specification into this phase, or start an empty one/);
      assert.equal(await specCount(), before);
    });

    test('refuses a phase of another organization, or one that does not exist, with the same message, and writes nothing', async () => {
      const theirs = await outsider.call('POST', '/api/species', { name: 'Guinea fowl (copy test)', family: 'poultry' });
      const theirPhase = await addPhase(outsider, theirs.body.id, 'Keet', '0–4 weeks');
      // Their own phase on a reference species too: invisible to organization A.
      const theirBroilerPhase = await addPhase(outsider, ref.broiler, 'Their broiler band', '28–35 days');
      const before = await specCount();
      for (const phaseId of [theirPhase, theirBroilerPhase, 987654]) {
        const { status, body } = await nutritionist.call('POST', `/api/specifications/${ref['nrc1994-broiler-grower']}/copy`, { phaseId });
        assert.equal(status, 400, `phase ${phaseId}`);
        assert.equal(body.error.fieldErrors.phaseId[0], `No phase with id ${phaseId} among the reference species and your organization’s own: choose a phase from the list.`);
      }
      assert.equal(await specCount(), before);
      // Their phase still takes a copy of a reference specification for them.
      assert.equal((await outsider.call('POST', `/api/specifications/${ref['nrc1994-broiler-grower']}/copy`, { phaseId: theirPhase })).status, 201);
    });

    test('another organization’s specification answers 404 to the outsider, even into the outsider’s own phase', async () => {
      const own = await nutritionist.call('POST', `/api/specifications/${ref['nrc1994-broiler-grower']}/copy`, { name: 'Kept at home' });
      const theirs = await outsider.call('GET', '/api/species');
      const theirPhase = (theirs.body.items as SpeciesBody[]).find((s) => s.name === 'Guinea fowl (copy test)')!.phases[0].id;
      const before = await specCount();
      const { status, body } = await outsider.call('POST', `/api/specifications/${own.body.id}/copy`, { phaseId: theirPhase });
      assert.equal(status, 404);
      assert.equal(body.error.code, 'not_found');
      assert.equal(await specCount(), before);
    });

    test('a role without requirements:write is refused and nothing is written', async () => {
      const phaseId = (await nutritionist.call('GET', `/api/specifications/${ref['nrc1994-broiler-starter']}`)).body.phase.id;
      const before = await specCount();
      for (const caller of [operator, advisor]) {
        const { status } = await caller.call('POST', `/api/specifications/${ref['nrc1994-broiler-grower']}/copy`, { phaseId });
        assert.equal(status, 403);
      }
      assert.equal(await specCount(), before);
    });

    test('answers 400 naming the field for a phase that is not an id, and for an unknown field', async () => {
      const text = await nutritionist.call('POST', `/api/specifications/${ref['nrc1994-broiler-grower']}/copy`, { phaseId: 'grower' });
      assert.equal(text.status, 400);
      assert.equal(text.body.error.fieldErrors.phaseId[0], 'choose the phase to copy into');
      const unknown = await nutritionist.call('POST', `/api/specifications/${ref['nrc1994-broiler-grower']}/copy`, { speciesId: ref['grow-finish-pig'] });
      assert.equal(unknown.status, 400);
      const blank = await nutritionist.call('POST', `/api/specifications/${ref['nrc1994-broiler-grower']}/copy`, { name: '   ' });
      assert.equal(blank.status, 400);
      assert.ok(blank.body.error.fieldErrors.name);
    });

    test('a copy made while its source is being saved holds the rows from before or after the save, never a mix', async () => {
      const own = await nutritionist.call('POST', `/api/specifications/${ref['nrc1994-broiler-grower']}/copy`, { name: 'Saved while copied' });
      const phaseId = await addPhase(nutritionist, ref.broiler, 'Race band', '35–42 days');
      let version = own.body.version;
      for (let round = 1; round <= 6; round += 1) {
        const bounds = own.body.bounds.map((b: { nutrientId: string; min: number | null; max: number | null }) => ({ nutrientId: b.nutrientId, min: b.min === null ? null : b.min + round, max: b.max }));
        const body = { speciesId: own.body.species.id, phaseId: own.body.phase.id, name: own.body.name, source: own.body.source, bounds, ratios: [], caps: [], expectedVersion: version };
        const [saved, copy] = await Promise.all([
          nutritionist.call('PUT', `/api/specifications/${own.body.id}`, body),
          nutritionist.call('POST', `/api/specifications/${own.body.id}/copy`, { phaseId }),
        ]);
        assert.equal(saved.status, 200);
        assert.equal(copy.status, 201);
        version = saved.body.version;
        const rows = await storedRows(copy.body.id);
        const shifts = new Set(rows.bounds.filter((b) => b.min !== null).map((b) => Math.round((b.min! - own.body.bounds.find((o: { nutrientId: string }) => o.nutrientId === b.nutrientId).min) * 1000) / 1000));
        assert.equal(shifts.size, 1, `round ${round}: every bound from the same save`);
        const shift = [...shifts][0];
        assert.ok(shift === round || shift === round - 1, `round ${round}: from the save before or this one`);
        assert.equal(rows.caps.length, shift === 0 ? own.body.caps.length : 0, 'caps from the same save as the bounds');
      }
    });
  });
});
