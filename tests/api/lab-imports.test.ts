import assert from 'node:assert/strict';
import { readFileSync } from 'node:fs';
import { after, before, describe, test } from 'node:test';
import { and, count, eq, isNull } from 'drizzle-orm';

import { ingredientNutrientValues, ingredients, ingredientValueSets, labColumnMappings, labImportAnalyses, labImports } from '../../server/db/schema';
import { REFERENCE_LIBRARY_STEP, seedDemoData } from '../../server/db/seed';
import { createOrganization, createUser, signedInClient, type Client } from '../helpers/accounts';
import { startTestApp, type TestApp } from '../helpers/app';

const fixture = (name: string) => readFileSync(new URL(`../fixtures/lab/${name}`, import.meta.url), 'utf8');
const close = (actual: number | undefined, expected: number, tolerance: number, what: string) =>
  assert.ok(actual !== undefined && Math.abs(actual - expected) <= tolerance, `${what}: got ${actual}, expected ${expected} ± ${tolerance}`);

const BSF_INSECT = { species: 'hermetia_illucens', processing: 'partially_defatted', substrate: 'brewery spent grains', substrateOrigin: 'plant', substrateAnimals: [] };

describe('lab imports API', () => {
  let app: TestApp;
  let advisor: Client;
  let nutritionist: Client;
  let outsider: Client;
  let maizeRef: number;

  before(async () => {
    app = await startTestApp('lab_imports_api');
    const db = app.database.db;
    await seedDemoData(db, [REFERENCE_LIBRARY_STEP]);
    const orgA = await createOrganization(db, 'Lab Test Farm', 'farm');
    const orgB = await createOrganization(db, 'Lab Test Other', 'farm');
    await createUser(db, { email: 'advisor@lab.example.org', organizationId: orgA.id, role: 'advisor' });
    await createUser(db, { email: 'nutri@lab.example.org', organizationId: orgA.id, role: 'nutritionist' });
    await createUser(db, { email: 'owner@other.example.org', organizationId: orgB.id, role: 'owner' });
    advisor = await signedInClient(app.server.baseUrl, 'advisor@lab.example.org');
    nutritionist = await signedInClient(app.server.baseUrl, 'nutri@lab.example.org');
    outsider = await signedInClient(app.server.baseUrl, 'owner@other.example.org');
    maizeRef = (await db.select().from(ingredients).where(and(isNull(ingredients.organizationId), eq(ingredients.code, 'maize'))))[0].id;
  });
  after(async () => app?.close());

  /** Rows in every table an import could write. */
  const counts = async () => {
    const db = app.database.db;
    const n = async (table: typeof ingredients | typeof ingredientValueSets | typeof ingredientNutrientValues | typeof labImports | typeof labImportAnalyses | typeof labColumnMappings) => (await db.select({ n: count() }).from(table))[0].n;
    return { ingredients: await n(ingredients), valueSets: await n(ingredientValueSets), values: await n(ingredientNutrientValues), imports: await n(labImports), analyses: await n(labImportAnalyses), mappings: await n(labColumnMappings) };
  };

  describe('POST /api/lab-imports/preview', () => {
    test('reads, converts and estimates without writing anything', async () => {
      const before = await counts();
      const { status, body } = await advisor.call('POST', '/api/lab-imports/preview', { fileName: 'maize.csv', text: fixture('maize.csv'), labName: 'Wend Feed Lab', estimation: { classId: 'maize' } });
      assert.equal(status, 200);
      assert.equal(body.ok, true);
      assert.ok(body.catalogue.some((n: { id: string }) => n.id === 'amen_poultry'));
      const amen = body.samples[0].values.find((v: { nutrientId: string }) => v.nutrientId === 'amen_poultry');
      // NRC (1994) Appendix B, Table B-1, corn (Janssen 1989): 3,359.9 kcal/kg as fed for this maize.
      close(amen.asFed, 3359.9, 0.05, 'AMEn estimate');
      assert.equal(amen.origin, 'estimated');
      assert.equal(amen.method.name, 'Maize grain AMEn (Janssen 1989)');
      assert.deepEqual(await counts(), before);
    });

    test('answers 400 naming the field for a bad request', async () => {
      const { status, body } = await advisor.call('POST', '/api/lab-imports/preview', { fileName: 'x.csv', text: 'a,b', estimation: { classId: 'rocket_fuel' } });
      assert.equal(status, 400);
      assert.ok(body.error.fieldErrors['estimation.classId']);
    });
  });

  describe('POST /api/lab-imports', () => {
    let larvaeId: number;

    test('creates a new ingredient from one sample, usable at once, and keeps the raw file and who uploaded it', async () => {
      const text = fixture('sample-per-row.csv');
      const { status, body } = await advisor.call('POST', '/api/lab-imports', {
        fileName: 'orrin-march.csv',
        text,
        labName: 'Wend Feed Lab',
        estimation: { classId: 'bsf_partially_defatted' },
        samples: [{ sampleId: 'OH-0312', target: { kind: 'new', name: 'Larvae meal, brewery grains', category: 'insect_meal', insect: BSF_INSECT } }],
      });
      assert.equal(status, 201, JSON.stringify(body));
      assert.equal(body.analyses.length, 1);
      larvaeId = body.analyses[0].ingredientId;
      assert.equal(body.analyses[0].createdIngredient, true);
      assert.equal(body.analyses[0].analysedOn, '2026-03-12');
      const db = app.database.db;
      const values = Object.fromEntries((await db.select().from(ingredientNutrientValues).where(eq(ingredientNutrientValues.ingredientId, larvaeId))).map((v) => [v.nutrientId, v.value]));
      // As fed, in catalogue units: Ca 21.5 g/kg = 2.15 %; DM 92.4 %; digestible Lys = 2.61 × 0.77 (Schiavone et al. 2017 mean AID).
      close(values.cp, 41.8, 1e-9, 'CP');
      close(values.ca, 2.15, 1e-9, 'Ca');
      close(values.dm, 92.4, 1e-9, 'DM');
      close(values.dig_lys, 2.61 * 0.77, 1e-6, 'digestible Lys');
      const sets = await db.select().from(ingredientValueSets).where(eq(ingredientValueSets.ingredientId, larvaeId));
      assert.ok(sets.some((s) => s.sourceKind === 'lab' && s.analysedOn === '2026-03-12' && s.dryMatterPct === 92.4));
      assert.ok(sets.some((s) => s.sourceKind === 'estimate' && /Schiavone|apparent ileal/.test(s.sourceName)), sets.map((s) => s.sourceName).join('\n'));
      const [saved] = await db.select().from(labImports).where(eq(labImports.id, body.id));
      assert.equal(saved.rawText, text);
      assert.ok(saved.uploadedByUserId);
      const file = await advisor.call('GET', `/api/lab-imports/${body.id}/file`);
      assert.equal(file.status, 200);
      assert.equal(file.body, text);
      assert.match(file.headers.get('content-disposition') ?? '', /orrin-march\.csv/);
    });

    test('adds a new dated analysis to the same ingredient from a file in the other layout, and the history compares them', async () => {
      const { status, body } = await nutritionist.call('POST', '/api/lab-imports', {
        fileName: 'orrin-march-2.csv',
        text: fixture('nutrient-per-row-semicolon.csv'),
        labName: 'Wend Feed Lab',
        analysedOn: '2026-03-19',
        estimation: { classId: 'bsf_partially_defatted' },
        samples: [{ sampleId: 'OH-0319', target: { kind: 'existing', ingredientId: larvaeId } }],
      });
      assert.equal(status, 201, JSON.stringify(body));
      const history = await nutritionist.call('GET', `/api/lab-imports/ingredients/${larvaeId}/analyses`);
      assert.equal(history.status, 200);
      assert.deepEqual(history.body.analyses.map((a: { sampleId: string; analysedOn: string }) => [a.sampleId, a.analysedOn]), [['OH-0312', '2026-03-12'], ['OH-0319', '2026-03-19']]);
      const cp = (i: number) => history.body.analyses[i].values.find((v: { nutrientId: string }) => v.nutrientId === 'cp');
      close(cp(0).asFed, 41.8, 1e-9, 'first CP');
      close(cp(1).asFed, 39.5, 1e-9, 'second CP');
      // The library now holds the newer analysis.
      const [current] = await app.database.db.select().from(ingredientNutrientValues).where(and(eq(ingredientNutrientValues.ingredientId, larvaeId), eq(ingredientNutrientValues.nutrientId, 'cp')));
      close(current.value, 39.5, 1e-9, 'current CP');
      const list = await advisor.call('GET', '/api/lab-imports');
      assert.equal(list.status, 200);
      assert.ok(list.body.items.length >= 2);
      assert.equal(list.body.items[0].fileName, 'orrin-march-2.csv');
    });

    test('an analysis typed on the ingredient’s page joins the same history, marked typed, with who recorded it, and goes into the library like an imported one', async () => {
      const before = await counts();
      const { status, body } = await advisor.call('POST', `/api/ingredients/${larvaeId}/lab-analyses`, {
        laboratory: 'Upper Wend county lab',
        sample: 'R-88',
        analysedOn: '2026-03-26',
        dryMatterPct: 93,
        basis: 'dry_matter',
        values: { cp: 45, ca: 2.4 },
      });
      assert.equal(status, 201, JSON.stringify(body));
      assert.equal(body.analysis.entry, 'typed');
      assert.equal(body.analysis.labImportId, null);
      assert.equal(body.analysis.recordedBy, 'advisor');
      assert.deepEqual([...body.analysis.applied].sort(), ['ca', 'cp', 'dm']);
      assert.deepEqual(body.kept, []);
      // On dry matter → as fed is arithmetic: 45 % × 93 / 100 = 41.85 %; 2.4 % × 0.93 = 2.232 %.
      close(body.ingredient.values.cp, 41.85, 1e-9, 'CP as fed');
      close(body.ingredient.values.ca, 2.232, 1e-9, 'Ca as fed');
      assert.equal(body.ingredient.values.dm, 93);
      const cpSet = body.ingredient.valueSets.find((v: { id: number }) => v.id === body.ingredient.nutrientValues.find((n: { nutrientId: string }) => n.nutrientId === 'cp').valueSetId);
      assert.deepEqual(
        { kind: cpSet.sourceKind, name: cpSet.sourceName, confidence: cpSet.confidence, analysedOn: cpSet.analysedOn, dm: cpSet.dryMatterPct },
        { kind: 'lab', name: 'Upper Wend county lab, sample R-88 (typed in by hand)', confidence: 'verified', analysedOn: '2026-03-26', dm: 93 },
      );
      const after = await counts();
      assert.equal(after.analyses, before.analyses + 1);
      assert.equal(after.imports, before.imports, 'a typed analysis is not a file');

      // Everyone who reads the library sees the history: both files and the typed analysis, oldest first.
      const history = await nutritionist.call('GET', `/api/lab-imports/ingredients/${larvaeId}/analyses`);
      assert.equal(history.status, 200);
      assert.deepEqual(
        history.body.analyses.map((a: { entry: string; analysedOn: string; labName: string; recordedBy: string; fileName: string | null }) => [a.entry, a.analysedOn, a.labName, a.recordedBy, a.fileName]),
        [
          ['file', '2026-03-12', 'Wend Feed Lab', 'advisor', 'orrin-march.csv'],
          ['file', '2026-03-19', 'Wend Feed Lab', 'nutri', 'orrin-march-2.csv'],
          ['typed', '2026-03-26', 'Upper Wend county lab', 'advisor', null],
        ],
      );
      const typedCp = history.body.analyses[2].values.find((v: { nutrientId: string }) => v.nutrientId === 'cp');
      assert.deepEqual(typedCp.reported, { value: 45, unit: '%', basis: 'dry_matter' });
      close(typedCp.asFed, 41.85, 1e-9, 'history CP as fed');
      close(typedCp.dryMatter, 45, 1e-9, 'history CP on DM');
    });

    test('an older analysis, typed or imported, is kept in the history but does not replace what a later-dated one gave', async () => {
      const typed = await advisor.call('POST', `/api/ingredients/${larvaeId}/lab-analyses`, { laboratory: 'Late report', analysedOn: '2026-03-05', dryMatterPct: 92, values: { cp: 40, ee: 25, na: 0.12 } });
      assert.equal(typed.status, 201, JSON.stringify(typed.body));
      assert.deepEqual(typed.body.analysis.applied, ['na']);
      assert.deepEqual(
        [...typed.body.kept].sort((a: { nutrientId: string }, b: { nutrientId: string }) => a.nutrientId.localeCompare(b.nutrientId)),
        [{ nutrientId: 'cp', heldSince: '2026-03-26' }, { nutrientId: 'dm', heldSince: '2026-03-26' }, { nutrientId: 'ee', heldSince: '2026-03-19' }],
      );
      close(typed.body.ingredient.values.cp, 41.85, 1e-9, 'CP of the newer analysis stays');
      const naSet = typed.body.ingredient.valueSets.find((v: { id: number }) => v.id === typed.body.ingredient.nutrientValues.find((n: { nutrientId: string }) => n.nutrientId === 'na').valueSetId);
      assert.equal(naSet.analysedOn, '2026-03-05');
      assert.equal(naSet.dryMatterPct, 92, 'a value keeps the dry matter of its own analysis');

      // The same rule for a file: sample OH-0312 again (dated 2026-03-12) fills only what nothing newer holds.
      const imported = await advisor.call('POST', '/api/lab-imports', {
        fileName: 'orrin-march-again.csv',
        text: fixture('sample-per-row.csv'),
        labName: 'Wend Feed Lab',
        samples: [{ sampleId: 'OH-0312', target: { kind: 'existing', ingredientId: larvaeId } }],
      });
      assert.equal(imported.status, 201, JSON.stringify(imported.body));
      const history = await advisor.call('GET', `/api/lab-imports/ingredients/${larvaeId}/analyses`);
      const row = history.body.analyses.find((a: { id: number }) => a.id === imported.body.analyses[0].id);
      assert.ok(!row.applied.includes('cp') && !row.applied.includes('dm') && !row.applied.includes('ee'), row.applied.join(', '));
      assert.ok(row.applied.includes('met'), 'methionine was last given by the same date, so the later record wins');
      const [cp] = await app.database.db.select().from(ingredientNutrientValues).where(and(eq(ingredientNutrientValues.ingredientId, larvaeId), eq(ingredientNutrientValues.nutrientId, 'cp')));
      close(cp.value, 41.85, 1e-9, 'current CP');
    });

    test('the same analysis typed in or imported from a file gives the same library values and history', async () => {
      const text = 'Sample,Dry matter %,Crude protein %,Ash %\nEQ-1,88,12,5\n';
      const fromFile = await nutritionist.call('POST', '/api/lab-imports', { fileName: 'eq.csv', text, labName: 'Same lab', basis: 'dry_matter', analysedOn: '2026-03-20', samples: [{ sampleId: 'EQ-1', target: { kind: 'new', name: 'Barley, from the file', category: 'cereal_grain' } }] });
      assert.equal(fromFile.status, 201, JSON.stringify(fromFile.body));
      const blank = await nutritionist.call('POST', '/api/ingredients', { name: 'Barley, typed in', category: 'cereal_grain' });
      const typed = await nutritionist.call('POST', `/api/ingredients/${blank.body.id}/lab-analyses`, { laboratory: 'Same lab', sample: 'EQ-1', analysedOn: '2026-03-20', dryMatterPct: 88, basis: 'dry_matter', values: { cp: 12, ash: 5 } });
      assert.equal(typed.status, 201, JSON.stringify(typed.body));
      const read = async (id: number) => {
        const detail = (await nutritionist.call('GET', `/api/ingredients/${id}`)).body;
        const sets = new Map(detail.valueSets.map((v: { id: number }) => [v.id, v]));
        return Object.fromEntries(
          detail.nutrientValues
            .filter((v: { nutrientId: string }) => ['dm', 'cp', 'ash'].includes(v.nutrientId))
            .map((v: { nutrientId: string; value: number; valueSetId: number }) => {
              const set = sets.get(v.valueSetId) as { sourceKind: string; confidence: string; analysedOn: string; dryMatterPct: number };
              return [v.nutrientId, { value: v.value, kind: set.sourceKind, confidence: set.confidence, analysedOn: set.analysedOn, dm: set.dryMatterPct }];
            }),
        );
      };
      const a = await read(fromFile.body.analyses[0].ingredientId);
      const b = await read(blank.body.id);
      assert.deepEqual(a, b);
      // On dry matter → as fed is arithmetic: 12 % × 88 / 100 = 10.56 %; 5 % × 0.88 = 4.4 %.
      close(b.cp.value, 10.56, 1e-9, 'CP as fed');
      close(b.ash.value, 4.4, 1e-9, 'ash as fed');
    });

    test('a typed analysis with bad input answers 400 field by field and writes nothing', async () => {
      const before = await counts();
      const url = `/api/ingredients/${larvaeId}/lab-analyses`;
      const shape = await advisor.call('POST', url, { laboratory: ' ', analysedOn: '2026-13-01', dryMatterPct: 0, basis: 'wet', values: { cp: -1 } });
      assert.equal(shape.status, 400);
      for (const field of ['laboratory', 'analysedOn', 'dryMatterPct', 'basis', 'values.cp']) assert.ok(shape.body.error.fieldErrors[field], `${field}: ${JSON.stringify(shape.body.error.fieldErrors)}`);
      const ok = { laboratory: 'County lab', analysedOn: '2026-03-27', dryMatterPct: 90 };
      const none = await advisor.call('POST', url, { ...ok, values: {} });
      assert.match(none.body.error.fieldErrors.values[0], /at least one value/);
      const dmTwice = await advisor.call('POST', url, { ...ok, values: { dm: 90 } });
      assert.match(dmTwice.body.error.fieldErrors['values.dm'][0], /its own field/);
      const unknown = await advisor.call('POST', url, { ...ok, values: { protein: 40 } });
      assert.match(unknown.body.error.fieldErrors['values.protein'][0], /not a nutrient in the catalogue/);
      // The file reader's plausibility limit on dry matter (90 % CP, common practice): 95 % as fed at 96 % DM is 98.96 % of DM.
      const implausible = await advisor.call('POST', url, { ...ok, dryMatterPct: 96, values: { cp: 95 } });
      assert.equal(implausible.status, 400);
      assert.match(implausible.body.error.fieldErrors['values.cp'][0], /98\.96 % of the dry matter, above the plausible 90 %/);
      // Proximate fractions cannot exceed the dry matter: (40 + 30 + 25) / 0.9 = 105.56 % of DM (arithmetic).
      const proximate = await advisor.call('POST', url, { ...ok, values: { cp: 40, ee: 30, ash: 25 } });
      assert.deepEqual(Object.keys(proximate.body.error.fieldErrors).sort(), ['values.ash', 'values.cp', 'values.ee']);
      assert.match(proximate.body.error.fieldErrors['values.ee'][0], /105\.56 % of the dry matter/);
      const future = await advisor.call('POST', url, { ...ok, analysedOn: '2099-01-01', values: { cp: 40 } });
      assert.match(future.body.error.fieldErrors.analysedOn[0], /in the future/);
      const reference = await advisor.call('POST', `/api/ingredients/${maizeRef}/lab-analyses`, { ...ok, values: { cp: 8.1 } });
      assert.equal(reference.status, 403);
      assert.equal(reference.body.error.code, 'read_only');
      assert.deepEqual(await counts(), before);
    });

    test('remembers the mapping per lab and applies it to the next file from that lab', async () => {
      const text = 'Sample,DM %,Prot.\nP-1,90,400\n';
      const mapping = { Sample: { target: 'sample_id', unit: '%', basis: 'as_fed' }, 'DM %': { target: 'dm', unit: '%', basis: 'as_fed' }, 'Prot.': { target: 'cp', unit: 'g/kg', basis: 'as_fed' } };
      const saved = await advisor.call('POST', '/api/lab-imports', { fileName: 'p.csv', text, labName: 'Hollow Analytical', analysedOn: '2026-02-01', mapping, samples: [{ sampleId: 'P-1', target: { kind: 'new', name: 'Protein test meal', category: 'oilseed_meal' } }] });
      assert.equal(saved.status, 201, JSON.stringify(saved.body));
      const remembered = await advisor.call('GET', '/api/lab-mappings?lab=hollow%20%20analytical');
      assert.equal(remembered.status, 200);
      assert.equal(remembered.body.mapping['Prot.'].target, 'cp');
      const next = await advisor.call('POST', '/api/lab-imports/preview', { fileName: 'p2.csv', text: 'Sample,DM %,Prot.\nP-2,91,410\n', labName: 'Hollow Analytical' });
      assert.equal(next.body.remembered['Prot.'].unit, 'g/kg');
      close(next.body.samples[0].values.find((v: { nutrientId: string }) => v.nutrientId === 'cp').asFed, 41, 1e-9, 'CP via the remembered mapping');
      const other = await outsider.call('GET', '/api/lab-mappings?lab=Hollow%20Analytical');
      assert.equal(other.body.mapping, null, 'another organization does not see the mapping');
    });

    test('an override replaces an estimate and is stored as entered by hand', async () => {
      const { status, body } = await advisor.call('POST', '/api/lab-imports', {
        fileName: 'maize.csv',
        text: fixture('maize.csv'),
        labName: 'Wend Feed Lab',
        analysedOn: '2026-03-01',
        estimation: { classId: 'maize', families: ['poultry'] },
        overrides: { 'MZ-1': { amen_poultry: 3300 } },
        samples: [{ sampleId: 'MZ-1', target: { kind: 'new', name: 'Maize, Wend 2026', category: 'cereal_grain' } }],
      });
      assert.equal(status, 201, JSON.stringify(body));
      const id = body.analyses[0].ingredientId;
      const [amen] = await app.database.db.select().from(ingredientNutrientValues).where(and(eq(ingredientNutrientValues.ingredientId, id), eq(ingredientNutrientValues.nutrientId, 'amen_poultry')));
      assert.equal(amen.value, 3300);
      const [set] = await app.database.db.select().from(ingredientValueSets).where(eq(ingredientValueSets.id, amen.valueSetId));
      assert.equal(set.sourceKind, 'estimate');
      assert.match(set.sourceName, /Entered over the estimate/);
    });

    describe('broken files write nothing', () => {
      const broken: [string, string, RegExp][] = [
        ['wrong-delimiter.csv', fixture('wrong-delimiter.csv'), /only one column/],
        ['text-in-numbers.csv', fixture('text-in-numbers.csv'), /“n\.d\.” is not a number/],
        ['empty.csv', fixture('empty.csv'), /The file is empty/],
        ['formula-injection.csv', fixture('formula-injection.csv'), /spreadsheet formula/],
        ['missing-header.csv', fixture('missing-header.csv'), /Add a header row/],
        ['implausible.csv', fixture('implausible.csv'), /above the plausible 90 %/],
      ];
      for (const [name, text, message] of broken) {
        test(`${name}: 400 with the message, by line and column, and no row written`, async () => {
          const before = await counts();
          const { status, body } = await advisor.call('POST', '/api/lab-imports', { fileName: name, text, labName: 'Wend Feed Lab', analysedOn: '2026-03-01', samples: [{ sampleId: 'OH-0312', target: { kind: 'new', name: 'Should not exist', category: 'oilseed_meal' } }] });
          assert.equal(status, 400);
          assert.equal(body.error.code, 'invalid_file');
          assert.match(body.error.message, /^Nothing was saved\./);
          assert.ok(Object.values(body.error.fieldErrors).flat().some((m) => message.test(String(m))), JSON.stringify(body.error));
          assert.deepEqual(await counts(), before);
        });
      }

      test('text-in-numbers: each problem keyed by its line and column', async () => {
        const { body } = await advisor.call('POST', '/api/lab-imports', { fileName: 't.csv', text: fixture('text-in-numbers.csv'), labName: 'L', analysedOn: '2026-03-01', samples: [{ sampleId: 'T-1', target: { kind: 'new', name: 'X', category: 'oilseed_meal' } }] });
        assert.deepEqual(Object.keys(body.error.fieldErrors), ['line 3, Crude protein %', 'line 4, Crude fat %']);
      });

      test('a file just over 2 MB gets the size message; a 5 MB body is refused before it is read', async () => {
        const before = await counts();
        // Long lines, so the JSON body stays under the server's 2 MiB body limit while the file is over 2 MB.
        const big = (bytes: number) => `Sample,DM %,Note\n${`S,90,${'x'.repeat(500)}\n`.repeat(Math.ceil(bytes / 506))}`;
        const over = await advisor.call('POST', '/api/lab-imports/preview', { fileName: 'big.csv', text: big(2_010_000) });
        assert.equal(over.status, 200);
        assert.match(over.body.issues[0].message, /the limit is 2 MB/);
        const huge = await advisor.call('POST', '/api/lab-imports', { fileName: 'huge.csv', text: big(5_000_000), labName: 'L', samples: [{ sampleId: 'S', target: { kind: 'new', name: 'X', category: 'oilseed_meal' } }] });
        assert.equal(huge.status, 413);
        assert.deepEqual(await counts(), before);
      });
    });

    test('all or nothing: when one sample cannot be saved, the other is not saved either', async () => {
      const before = await counts();
      const { status, body } = await advisor.call('POST', '/api/lab-imports', {
        fileName: 'two.csv',
        text: fixture('sample-per-row.csv'),
        labName: 'Wend Feed Lab',
        estimation: { classId: 'bsf_partially_defatted' },
        samples: [
          { sampleId: 'OH-0312', target: { kind: 'new', name: 'Would be saved first', category: 'insect_meal', insect: BSF_INSECT } },
          { sampleId: 'OH-0319', target: { kind: 'existing', ingredientId: maizeRef } },
        ],
      });
      assert.equal(status, 403, JSON.stringify(body));
      assert.match(body.error.message, /reference library cannot be changed/);
      assert.deepEqual(await counts(), before);
    });

    test('another organization’s ingredient answers 404 and nothing is written', async () => {
      const before = await counts();
      const { status } = await outsider.call('POST', '/api/lab-imports', { fileName: 'm.csv', text: fixture('maize.csv'), labName: 'L', analysedOn: '2026-03-01', samples: [{ sampleId: 'MZ-1', target: { kind: 'existing', ingredientId: larvaeId } }] });
      assert.equal(status, 404);
      assert.deepEqual(await counts(), before);
      const history = await outsider.call('GET', `/api/lab-imports/ingredients/${larvaeId}/analyses`);
      assert.equal(history.status, 404);
    });

    test('a sample that is not in the file, or without a date, is a 400 that names it', async () => {
      const missing = await advisor.call('POST', '/api/lab-imports', { fileName: 'm.csv', text: fixture('maize.csv'), labName: 'L', analysedOn: '2026-03-01', samples: [{ sampleId: 'NOPE', target: { kind: 'new', name: 'X', category: 'cereal_grain' } }] });
      assert.equal(missing.status, 400);
      assert.match(missing.body.error.message, /no sample “NOPE”/);
      const undated = await advisor.call('POST', '/api/lab-imports', { fileName: 'm.csv', text: fixture('maize.csv'), labName: 'L', samples: [{ sampleId: 'MZ-1', target: { kind: 'new', name: 'X', category: 'cereal_grain' } }] });
      assert.equal(undated.status, 400);
      assert.match(undated.body.error.message, /enter the date of analysis/);
    });
  });
});
