/** `npm start`: private database up, migrations and demo data, web app built if stale, one server for both. */
import { closeOnSignals, runServer, setUpMail } from '../index';
import { SetupError } from '../db/mariadb';
import { readEnv } from '../env';
import { prepareLocalDatabase } from './local-db';
import { ensureWebBuild } from './web-build';

async function main() {
  const env = readEnv();
  const dbUrl = await prepareLocalDatabase(env);
  ensureWebBuild();
  const mail = await setUpMail(env);
  const running = await runServer({ ...mail, publicUrl: env.PUBLIC_URL, secureCookies: env.PUBLIC_URL?.startsWith('https:'), host: env.HOST, port: env.PORT, dbUrl });
  console.log(`\nTroughline is serving at ${running.url}\n(the database keeps running; stop it with: npm run db:stop)`);
  closeOnSignals(async () => {
    await running.close();
    await mail.devInbox?.close();
  });
}

main().catch((error) => {
  console.error(error instanceof SetupError || error instanceof Error ? `\n${error.message}` : error);
  process.exit(1);
});
