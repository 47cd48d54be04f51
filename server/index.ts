import type { Server } from 'node:http';
import { fileURLToPath } from 'node:url';
import type { RequestHandler } from 'express';

import { createApp } from './app';
import { openDb } from './db/client';
import { databaseUrl, readEnv } from './env';

export const WEB_DIST = fileURLToPath(new URL('../dist', import.meta.url));

export type RunningServer = { server: Server; url: string; close: () => Promise<void> };

/** Listens on host:port and closes the HTTP server and the database pool on SIGINT/SIGTERM. */
export async function runServer({ host, port, dbUrl, webProxy }: { host: string; port: number; dbUrl: string; webProxy?: RequestHandler }): Promise<RunningServer> {
  const handle = openDb(dbUrl);
  const app = createApp({ db: handle.db, webDist: WEB_DIST, webProxy });
  const server = await new Promise<Server>((resolve, reject) => {
    const s = app.listen(port, host, () => resolve(s));
    s.once('error', reject);
  }).catch((error: NodeJS.ErrnoException) => {
    void handle.close();
    if (error.code === 'EADDRINUSE') throw new Error(`Port ${port} is already in use. Set PORT to another port, e.g. PORT=8650 npm start.`);
    throw error;
  });
  const close = async () => {
    await new Promise<void>((resolve) => server.close(() => resolve()));
    await handle.close();
  };
  return { server, url: `http://${host}:${port}`, close };
}

/** Stops cleanly on Ctrl-C or a service manager's TERM, so no request is cut mid-write. */
export function closeOnSignals(close: () => Promise<void>) {
  let closing = false;
  for (const signal of ['SIGINT', 'SIGTERM'] as const) {
    process.once(signal, () => {
      if (closing) return;
      closing = true;
      console.log('\nStopping Troughline…');
      close().then(() => process.exit(0), (error) => { console.error(error); process.exit(1); });
    });
  }
}

// `npm run serve`: the API and exported app against an already running database.
if (process.argv[1] && fileURLToPath(import.meta.url) === process.argv[1]) {
  const env = readEnv();
  runServer({ host: env.HOST, port: env.PORT, dbUrl: databaseUrl(env) }).then(
    (running) => {
      console.log(`Troughline is serving at ${running.url}`);
      closeOnSignals(running.close);
    },
    (error) => {
      console.error(error instanceof Error ? error.message : error);
      process.exit(1);
    },
  );
}
