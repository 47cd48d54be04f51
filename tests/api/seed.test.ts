import assert from 'node:assert/strict';
import { after, before, describe, test } from 'node:test';

import { organizations, seedRuns } from '../../server/db/schema';
import { DEMO_SEED_STEPS, seedDemoData } from '../../server/db/seed';
import { createTestDatabase, type TestDatabase } from '../helpers/db';

describe('demo data seeding', () => {
  let database: TestDatabase;

  before(async () => {
    database = await createTestDatabase('seed');
  });
  after(async () => database.drop());

  test('applies every step once, and a second start adds nothing', async () => {
    const first = await seedDemoData(database.db);
    assert.deepEqual(first, DEMO_SEED_STEPS.map((step) => step.name));
    const orgCount = (await database.db.select().from(organizations)).length;
    assert.ok(orgCount >= 3, 'the demo scenario has a mill, a farm and an advisory office');

    const second = await seedDemoData(database.db);
    assert.deepEqual(second, []);
    assert.equal((await database.db.select().from(organizations)).length, orgCount);
  });

  test('a step that fails leaves nothing half-written and is not recorded as done', async () => {
    const before = (await database.db.select().from(organizations)).length;
    const failing = {
      name: 'failing-step',
      apply: async (tx: typeof database.db) => {
        await tx.insert(organizations).values({ name: 'Half-written Mill', kind: 'feed_mill' });
        throw new Error('boom in the middle of a seed');
      },
    };
    await assert.rejects(seedDemoData(database.db, [failing]), /boom/);
    assert.equal((await database.db.select().from(organizations)).length, before);
    const runs = await database.db.select().from(seedRuns);
    assert.ok(!runs.some((run) => run.name === 'failing-step'));
  });
});
