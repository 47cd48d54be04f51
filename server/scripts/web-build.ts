import { execFileSync } from 'node:child_process';
import { existsSync, readdirSync, statSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';

const ROOT = fileURLToPath(new URL('../..', import.meta.url));
const SOURCES = ['app', 'src', 'fonts', 'app.json', 'babel.config.js', 'package-lock.json'];

function newestMtime(path: string): number {
  if (!existsSync(path)) return 0;
  const stat = statSync(path);
  if (!stat.isDirectory()) return stat.mtimeMs;
  let newest = stat.mtimeMs;
  for (const entry of readdirSync(path)) newest = Math.max(newest, newestMtime(join(path, entry)));
  return newest;
}

/** True when dist/ is missing or older than any source of the web app. */
export function webBuildIsStale(): boolean {
  const built = join(ROOT, 'dist', 'index.html');
  if (!existsSync(built)) return true;
  const builtAt = statSync(built).mtimeMs;
  return SOURCES.some((source) => newestMtime(join(ROOT, source)) > builtAt);
}

/** Exports the web app with Expo into dist/ when it is stale (15 to 25 s cold). */
export function ensureWebBuild(log: (line: string) => void = console.log): void {
  if (!webBuildIsStale()) return;
  log('Building the web app (expo export)…');
  execFileSync(join(ROOT, 'node_modules', '.bin', 'expo'), ['export', '--platform', 'web', '--output-dir', 'dist'], {
    cwd: ROOT,
    stdio: ['ignore', 'ignore', 'inherit'],
    env: { ...process.env, CI: '1', EXPO_NO_TELEMETRY: '1' },
  });
}
