import type { Server } from 'node:http';
import { fileURLToPath } from 'node:url';
import type { RequestHandler } from 'express';

import { createApp, type AppOptions } from './app';
import { openDb } from './db/client';
import { databaseUrl, readEnv, type Env } from './env';
import { startDevInbox, type DevInbox } from './mail/dev-inbox';
import { createSmtpMailer, type Mailer } from './mail/mailer';

export const WEB_DIST = fileURLToPath(new URL('../dist', import.meta.url));

export type RunningServer = { server: Server; url: string; close: () => Promise<void> };

/** Listens on host:port and closes the HTTP server and the database pool on SIGINT/SIGTERM. */
export async function runServer({ host, port, dbUrl, webProxy, ...appOptions }: { host: string; port: number; dbUrl: string; webProxy?: RequestHandler } & Omit<AppOptions, 'db'>): Promise<RunningServer> {
  const handle = openDb(dbUrl);
  const app = createApp({ db: handle.db, webDist: WEB_DIST, webProxy, ...appOptions });
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

/**
 * E-mail as configured: SMTP_URL when set; otherwise, outside production, a fake SMTP server on
 * loopback whose messages the developer page /dev/mail lists.
 */
export async function setUpMail(env: Env): Promise<{ mailer?: Mailer; devInbox?: DevInbox }> {
  if (env.SMTP_URL) return { mailer: createSmtpMailer(env.SMTP_URL, env.MAIL_FROM) };
  if (env.NODE_ENV === 'production') {
    console.warn('SMTP_URL is not set: invitations and password resets cannot be sent.');
    return {};
  }
  const devInbox = await startDevInbox(env.DEV_SMTP_PORT);
  console.log(`E-mail goes to the development inbox (SMTP 127.0.0.1:${devInbox.port}); read it at /dev/mail`);
  return { devInbox, mailer: createSmtpMailer(`smtp://127.0.0.1:${devInbox.port}`, env.MAIL_FROM) };
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
  setUpMail(env).then((mail) => runServer({ host: env.HOST, port: env.PORT, dbUrl: databaseUrl(env), publicUrl: env.PUBLIC_URL, secureCookies: env.PUBLIC_URL?.startsWith('https:'), ...mail })).then(
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
