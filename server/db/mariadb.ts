/**
 * A private MariaDB server for Troughline: its own data directory, socket and port on 127.0.0.1,
 * never the system's instance. Used by `npm start`, `npm run dev`, `npm run db:*` and `npm test`.
 */
import { execFileSync, spawn } from 'node:child_process';
import { createHash } from 'node:crypto';
import { existsSync, mkdirSync, readFileSync, rmSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { setTimeout as sleep } from 'node:timers/promises';

export type MariadbInstance = {
  dataDir: string;
  socket: string;
  pidFile: string;
  logFile: string;
  port: number;
};

const SBIN_DIRS = ['/usr/sbin', '/usr/bin', '/usr/local/sbin', '/usr/local/bin'];

function findBinary(name: string): string | undefined {
  const dirs = [...(process.env.PATH ?? '').split(':'), ...SBIN_DIRS].filter(Boolean);
  for (const dir of dirs) {
    const candidate = join(dir, name);
    if (existsSync(candidate)) return candidate;
  }
  return undefined;
}

const isRoot = () => typeof process.getuid === 'function' && process.getuid() === 0;

/** Thrown when something the user must do by hand stands in the way; the message names the one command. */
export class SetupError extends Error {}

/**
 * Makes sure Debian's MariaDB server is installed: installs it when running as root, otherwise
 * stops with the one command to run.
 */
export function ensureMariadbInstalled(log: (line: string) => void = console.log): void {
  if (findBinary('mariadbd') && findBinary('mariadb-install-db')) return;
  if (!isRoot()) {
    throw new SetupError('MariaDB is not installed. Run this once, then try again:\n  sudo apt-get install -y mariadb-server');
  }
  log('Installing mariadb-server from Debian packages (one time)…');
  execFileSync('apt-get', ['update', '-qq'], { stdio: 'inherit' });
  execFileSync('apt-get', ['install', '-y', '-qq', 'mariadb-server'], { stdio: 'inherit', env: { ...process.env, DEBIAN_FRONTEND: 'noninteractive' } });
}

/** Describes the instance that lives in `dataDir` (created or not). */
export function describeInstance(dataDir: string, port: number): MariadbInstance {
  const absolute = resolve(dataDir);
  let socket = join(absolute, 'mariadb.sock');
  // Unix socket paths are limited to 107 bytes; a deep checkout falls back to a short path in /tmp.
  if (socket.length > 100) socket = `/tmp/troughline-${createHash('sha1').update(absolute).digest('hex').slice(0, 12)}.sock`;
  return { dataDir: absolute, socket, pidFile: join(absolute, 'mariadb.pid'), logFile: join(absolute, 'mariadb.log'), port };
}

function adminArgs(instance: MariadbInstance, ...rest: string[]): string[] {
  return ['--no-defaults', `--socket=${instance.socket}`, '-uroot', ...rest];
}

/** True when the server in this data directory answers on its socket. */
export function isRunning(instance: MariadbInstance): boolean {
  const admin = findBinary('mariadb-admin');
  if (!admin || !existsSync(instance.socket)) return false;
  try {
    execFileSync(admin, adminArgs(instance, 'ping'), { stdio: 'ignore', timeout: 5000 });
    return true;
  } catch {
    return false;
  }
}

export type StartOptions = {
  /** Wipe the data directory first (tests). Default false: data survives restarts. */
  fresh?: boolean;
  /** Smaller InnoDB log for throwaway test data directories. */
  small?: boolean;
  log?: (line: string) => void;
};

/**
 * Starts the private server (initialising the data directory on first use) and waits until it answers.
 * Returns false when it was already running.
 */
export async function startMariadb(instance: MariadbInstance, { fresh = false, small = false, log = console.log }: StartOptions = {}): Promise<boolean> {
  ensureMariadbInstalled(log);
  if (fresh && isRunning(instance)) await stopMariadb(instance);
  if (fresh) rmSync(instance.dataDir, { recursive: true, force: true });
  if (isRunning(instance)) return false;

  const userArgs = isRoot() ? ['--user=root'] : [];
  if (!existsSync(join(instance.dataDir, 'mysql'))) {
    mkdirSync(instance.dataDir, { recursive: true });
    execFileSync(
      findBinary('mariadb-install-db')!,
      ['--no-defaults', ...userArgs, `--datadir=${instance.dataDir}`, '--auth-root-authentication-method=normal', '--skip-test-db'],
      { stdio: 'ignore' },
    );
  }

  const args = [
    '--no-defaults',
    ...userArgs,
    `--datadir=${instance.dataDir}`,
    `--socket=${instance.socket}`,
    `--pid-file=${instance.pidFile}`,
    `--port=${instance.port}`,
    '--bind-address=127.0.0.1',
    '--skip-name-resolve',
    `--log-error=${instance.logFile}`,
    '--character-set-server=utf8mb4',
    '--collation-server=utf8mb4_unicode_ci',
    ...(small ? ['--innodb-log-file-size=8M', '--innodb-buffer-pool-size=64M'] : []),
  ];
  const child = spawn(findBinary('mariadbd')!, args, { detached: true, stdio: 'ignore' });
  child.unref();

  const deadline = Date.now() + 30_000;
  while (Date.now() < deadline) {
    if (isRunning(instance)) return true;
    if (child.exitCode !== null) break;
    await sleep(150);
  }
  const tail = existsSync(instance.logFile) ? readFileSync(instance.logFile, 'utf8').split('\n').slice(-15).join('\n') : '(no log)';
  throw new SetupError(`MariaDB did not start on port ${instance.port}. Is the port taken? Last lines of ${instance.logFile}:\n${tail}`);
}

/** Stops the private server cleanly and waits for it to go. */
export async function stopMariadb(instance: MariadbInstance): Promise<boolean> {
  if (!isRunning(instance)) return false;
  execFileSync(findBinary('mariadb-admin')!, adminArgs(instance, 'shutdown'), { stdio: 'ignore', timeout: 30_000 });
  const deadline = Date.now() + 30_000;
  while (existsSync(instance.pidFile) && Date.now() < deadline) await sleep(100);
  return true;
}

/** Runs SQL as root over the socket (creating databases and users). */
export function runRootSql(instance: MariadbInstance, sql: string): void {
  execFileSync(findBinary('mariadb')!, adminArgs(instance, '-e', sql), { stdio: ['ignore', 'ignore', 'pipe'] });
}

const quoteIdent = (name: string) => {
  if (!/^[A-Za-z0-9_]+$/.test(name)) throw new Error(`Unsafe database or user name: ${name}`);
  return name;
};

/** Creates (if missing) a database and a user that may use it from 127.0.0.1 with a password. */
export function ensureDatabase(instance: MariadbInstance, database: string, user: string, password: string, { dropFirst = false, allDatabases = false } = {}): void {
  const db = quoteIdent(database);
  const u = quoteIdent(user);
  const pw = password.replace(/'/g, "''");
  const scope = allDatabases ? '*.*' : `\`${db}\`.*`;
  runRootSql(
    instance,
    [
      dropFirst ? `DROP DATABASE IF EXISTS \`${db}\`` : '',
      `CREATE DATABASE IF NOT EXISTS \`${db}\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci`,
      `CREATE USER IF NOT EXISTS '${u}'@'127.0.0.1' IDENTIFIED BY '${pw}'`,
      `GRANT ALL PRIVILEGES ON ${scope} TO '${u}'@'127.0.0.1'`,
      'FLUSH PRIVILEGES',
    ].filter(Boolean).join('; '),
  );
}
