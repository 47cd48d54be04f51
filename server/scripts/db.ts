/** `npm run db:start | db:stop | db:migrate | db:seed` for the private development database. */
import { SetupError, stopMariadb } from '../db/mariadb';
import { readEnv } from '../env';
import { devInstance, prepareLocalDatabase } from './local-db';

const command = process.argv[2];
const env = readEnv();

async function main() {
  switch (command) {
    case 'start':
    case 'migrate':
      await prepareLocalDatabase(env, { seed: false });
      console.log('Database ready, migrations applied.');
      break;
    case 'seed':
      await prepareLocalDatabase(env, { seed: true });
      console.log('Database ready, demo data present.');
      break;
    case 'stop':
      console.log((await stopMariadb(devInstance(env))) ? 'MariaDB stopped.' : 'MariaDB was not running.');
      break;
    default:
      console.error('Usage: db.ts start|stop|migrate|seed');
      process.exit(2);
  }
}

main().catch((error) => {
  console.error(error instanceof SetupError ? error.message : error);
  process.exit(1);
});
