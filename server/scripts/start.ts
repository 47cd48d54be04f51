/** `npm start`: private database up, migrations and demo data, web app built if stale, one server for both. */
import { closeOnSignals, runServer } from '../index';
import { SetupError } from '../db/mariadb';
import { readEnv } from '../env';
import { prepareLocalDatabase } from './local-db';
import { ensureWebBuild } from './web-build';

async function main() {
  const env = readEnv();
  const dbUrl = await prepareLocalDatabase(env);
  ensureWebBuild();
  const running = await runServer({ host: env.HOST, port: env.PORT, dbUrl });
  console.log(`\nTroughline is serving at ${running.url}\n(the database keeps running; stop it with: npm run db:stop)`);
  closeOnSignals(running.close);
}

main().catch((error) => {
  console.error(error instanceof SetupError || error instanceof Error ? `\n${error.message}` : error);
  process.exit(1);
});
