import assert from 'node:assert/strict';
import { describe, test } from 'node:test';

import { isoDate } from '../../../src/shared/schemas/library-common';

// Calendar facts (Gregorian calendar, ISO 8601 dates): February has 29 days in years divisible by 4, except
// century years not divisible by 400; April, June, September and November have 30 days. Common practice.
describe('dates on prices and lab analyses', () => {
  test('real dates pass, leap days only in leap years', () => {
    for (const date of ['2026-03-31', '2024-02-29', '2000-02-29', '2026-12-01']) assert.equal(isoDate.safeParse(date).success, true, date);
  });

  test('dates that do not exist are refused with a message, not rolled over into the next month', () => {
    for (const date of ['2026-02-30', '2026-02-29', '1900-02-29', '2026-04-31', '2026-13-01', '2026-00-10', '2026-06-00']) {
      const parsed = isoDate.safeParse(date);
      assert.equal(parsed.success, false, date);
      assert.match(parsed.error!.issues[0].message, /not a real date/, date);
    }
  });

  test('the shape is explained when it is wrong', () => {
    const parsed = isoDate.safeParse('31/03/2026');
    assert.equal(parsed.success, false);
    assert.match(parsed.error!.issues[0].message, /2026-03-31/);
  });
});
