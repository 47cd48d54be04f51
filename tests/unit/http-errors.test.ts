import assert from 'node:assert/strict';
import { describe, test } from 'node:test';
import { z } from 'zod';

import { flattenZodError } from '../../server/http/error-handler';

describe('flattenZodError', () => {
  test('names nested fields the way a person reads them', () => {
    const schema = z.object({ ratios: z.array(z.object({ numerator: z.string().min(1) })) });
    const result = schema.safeParse({ ratios: [{ numerator: 'lys' }, { numerator: '' }] });
    assert.equal(result.success, false);
    const fields = flattenZodError(result.error!);
    assert.deepEqual(Object.keys(fields), ['ratios[1].numerator']);
  });

  test('puts errors about the whole body under (body)', () => {
    const result = z.object({ a: z.number() }).safeParse('not an object');
    assert.deepEqual(Object.keys(flattenZodError(result.error!)), ['(body)']);
  });
});
