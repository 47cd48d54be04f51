/**
 * `npm test [unit|api|e2e] [file filter]`: starts a private, throwaway MariaDB for the run, builds the web app
 * when browser tests are included, then runs the test files with node's test runner.
 * Exits non-zero on any failure; the runner's closing lines give the pass and fail counts.
 */
import { execFileSync, spawn } from 'node:child_process';
import { existsSync, readdirSync, statSync } from 'node:fs';
import { join, relative } from 'node:path';
import { fileURLToPath } from 'node:url';

import { describeInstance, ensureDatabase, SetupError, startMariadb, stopMariadb } from '../server/db/mariadb';
import { ensureWebBuild } from '../server/scripts/web-build';
import { TEST_DB_PASSWORD, TEST_DB_PORT, TEST_DB_USER } from './helpers/test-env';

const ROOT = fileURLToPath(new URL('..', import.meta.url));
const SUITES = ['unit', 'api', 'e2e'] as const;
type Suite = (typeof SUITES)[number];

function listTests(dir: string): string[] {
  if (!existsSync(dir)) return [];
  return readdirSync(dir).flatMap((entry) => {
    const path = join(dir, entry);
    if (statSync(path).isDirectory()) return listTests(path);
    return /\.test\.tsx?$/.test(entry) ? [path] : [];
  }).sort();
}

function ensureChromium() {
  if (existsSync('/usr/bin/chromium')) return;
  if (process.getuid?.() !== 0) throw new SetupError('Browser tests need Debian’s Chromium. Run this once, then try again:\n  sudo apt-get install -y chromium');
  console.log('Installing chromium from Debian packages (one time)…');
  execFileSync('apt-get', ['update', '-qq'], { stdio: 'inherit' });
  execFileSync('apt-get', ['install', '-y', '-qq', 'chromium'], { stdio: 'inherit', env: { ...process.env, DEBIAN_FRONTEND: 'noninteractive' } });
}

async function main(): Promise<number> {
  const [suiteArg, filter] = process.argv.slice(2);
  const suites: Suite[] = suiteArg && SUITES.includes(suiteArg as Suite) ? [suiteArg as Suite] : [...SUITES];
  const files = suites.flatMap((suite) => listTests(join(ROOT, 'tests', suite))).filter((file) => !filter || file.includes(filter));
  if (files.length === 0) {
    console.error(`No test files match ${suites.join(', ')}${filter ? ` / "${filter}"` : ''}.`);
    return 1;
  }

  const needsDb = files.some((file) => !file.includes(`${join('tests', 'unit')}`));
  // One data directory per port, so runs on different ports never wipe each other's server.
  const instance = describeInstance(join(ROOT, '.data', `mariadb-test-${TEST_DB_PORT}`), TEST_DB_PORT);
  if (needsDb) {
    // A new data directory every run: tests never see leftovers or the demo data.
    await startMariadb(instance, { fresh: true, small: true });
    ensureDatabase(instance, 'troughline_test', TEST_DB_USER, TEST_DB_PASSWORD, { allDatabases: true });
  }
  if (suites.includes('e2e') && files.some((file) => file.includes(join('tests', 'e2e')))) {
    ensureChromium();
    ensureWebBuild();
  }

  console.log(`Running ${files.length} test files: ${files.map((file) => relative(ROOT, file)).join(', ')}`);
  const code = await new Promise<number>((resolve) => {
    const child = spawn(process.execPath, ['--import', 'tsx', '--test', '--test-reporter=spec', '--test-concurrency=2', ...files], {
      cwd: ROOT,
      stdio: 'inherit',
      env: { ...process.env, NODE_ENV: 'test', TEST_DB_PORT: String(TEST_DB_PORT) },
    });
    child.on('exit', (exitCode) => resolve(exitCode ?? 1));
  });
  if (needsDb) await stopMariadb(instance);
  return code;
}

main().then(
  (code) => process.exit(code),
  (error) => {
    console.error(error instanceof SetupError ? error.message : error);
    process.exit(1);
  },
);
