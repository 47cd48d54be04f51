import assert from 'node:assert/strict';
import { describe, test } from 'node:test';

import { AttemptLimiter } from '../../server/auth/rate-limit';

describe('AttemptLimiter', () => {
  test('lets a key fail up to the limit, then makes it wait until the window ends', () => {
    let now = 0;
    const limiter = new AttemptLimiter(3, 60_000, () => now);
    for (let i = 0; i < 3; i++) {
      assert.equal(limiter.retryAfterSeconds('a'), 0);
      limiter.recordFailure('a');
    }
    assert.equal(limiter.retryAfterSeconds('a'), 60);
    assert.equal(limiter.retryAfterSeconds('b'), 0, 'other keys are not affected');
    now = 45_000;
    assert.equal(limiter.retryAfterSeconds('a'), 15);
    now = 60_001;
    assert.equal(limiter.retryAfterSeconds('a'), 0, 'a new window starts');
  });

  test('a success clears the key', () => {
    const limiter = new AttemptLimiter(2, 60_000, () => 0);
    limiter.recordFailure('a');
    limiter.recordFailure('a');
    limiter.clear('a');
    assert.equal(limiter.retryAfterSeconds('a'), 0);
  });
});
