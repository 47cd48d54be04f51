import assert from 'node:assert/strict';
import { describe, test } from 'node:test';

import { describeInstance } from '../../server/db/mariadb';
import { readEnv, databaseUrl } from '../../server/env';

describe('private MariaDB instance', () => {
  test('keeps its socket, pid and log inside its own data directory', () => {
    const instance = describeInstance('/srv/app/.data/mariadb', 8641);
    assert.equal(instance.socket, '/srv/app/.data/mariadb/mariadb.sock');
    assert.equal(instance.pidFile, '/srv/app/.data/mariadb/mariadb.pid');
    assert.equal(instance.port, 8641);
  });

  test('falls back to a short socket path in /tmp when the checkout is deep (unix sockets take at most 107 bytes)', () => {
    const deep = `/work/${'very-long-folder-name/'.repeat(5)}.data/mariadb`;
    const instance = describeInstance(deep, 8641);
    assert.ok(instance.socket.length <= 100);
    assert.match(instance.socket, /^\/tmp\/troughline-[0-9a-f]{12}\.sock$/);
    assert.equal(describeInstance(deep, 8641).socket, instance.socket, 'the same folder always gets the same socket');
  });
});

describe('environment', () => {
  test('defaults to loopback, its own ports and never the system MariaDB port 3306', () => {
    const env = readEnv({});
    assert.equal(env.HOST, '127.0.0.1');
    assert.equal(env.PORT, 8640);
    assert.notEqual(env.DB_PORT, 3306);
    assert.match(databaseUrl(env), /^mysql:\/\/troughline:.+@127\.0\.0\.1:8641\/troughline$/);
  });

  test('stops with the variable named when a value is wrong', () => {
    assert.throws(() => readEnv({ PORT: 'eighty' }), /PORT/);
  });
});
