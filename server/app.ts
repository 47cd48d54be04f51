import { existsSync } from 'node:fs';
import { join } from 'node:path';
import express, { type Express, type RequestHandler } from 'express';

import type { AccountsDeps } from './auth/deps';
import { createLucia } from './auth/lucia';
import { AttemptLimiter } from './auth/rate-limit';
import { sameOriginOnly, sessionMiddleware } from './auth/session-middleware';
import type { Db } from './db/client';
import { apiNotFound, errorHandler } from './http/error-handler';
import { HttpError } from './http/errors';
import type { DevInbox } from './mail/dev-inbox';
import type { Mailer } from './mail/mailer';
import { authRouter } from './routes/auth';
import { batchesRouter } from './routes/batches';
import { batchSheetsRouter } from './routes/batch-sheets';
import { devMailRouter } from './routes/dev-mail';
import { formulasRouter } from './routes/formulas';
import { formulationRouter } from './routes/formulation';
import { healthRouter } from './routes/health';
import { invitationsRouter } from './routes/invitations';
import { labImportsRouter } from './routes/lab-imports';
import { libraryRoutes } from './routes/library-routes';
import { membersRouter } from './routes/members';
import { organizationSettingsRouter } from './routes/organization-settings';
import { rationChecksRouter } from './routes/ration-checks';
import { sharesRouter } from './routes/shares';
import { supplyPlansRouter } from './routes/supply-plans';

export type AppOptions = {
  db: Db;
  /** Sends invitations and reset links. Without one, routes that mail answer 503 and say so. */
  mailer?: Mailer;
  /** The local fake SMTP server, whose messages GET /api/dev/mail lists (development and tests only). */
  devInbox?: DevInbox;
  /** Base of links in e-mails (PUBLIC_URL); defaults to the address each request came to. */
  publicUrl?: string;
  /** Mark the session cookie Secure (serving over https). */
  secureCookies?: boolean;
  /** Folder of the exported web app to serve (dist/). Omit to serve the API only. */
  webDist?: string;
  /** In development, everything that is not /api goes to Metro through this proxy. */
  webProxy?: RequestHandler;
};

const noMailer: Mailer = {
  from: '',
  send: async () => {
    throw new HttpError(503, 'mail_unavailable', 'E-mail is not set up on this server (set SMTP_URL), so nothing was sent.');
  },
};

/** Builds the Express app; tests call it with their own database and inbox. */
export function createApp({ db, mailer, devInbox, publicUrl, secureCookies = false, webDist, webProxy }: AppOptions): Express {
  const app = express();
  app.disable('x-powered-by');
  app.set('trust proxy', 'loopback');

  const lucia = createLucia(db, { secureCookies });
  const accounts: AccountsDeps = {
    db,
    lucia,
    mailer: mailer ?? noMailer,
    publicUrl,
    // 10 failed sign-ins per address and client, 50 per client, per 15 minutes.
    signInLimiter: new AttemptLimiter(10, 15 * 60_000),
    clientLimiter: new AttemptLimiter(50, 15 * 60_000),
    resetLimiter: new AttemptLimiter(20, 60 * 60_000),
  };

  const api = express.Router();
  api.use(express.json({ limit: '2mb' }));
  api.use(sameOriginOnly);
  api.use(sessionMiddleware(lucia, db));
  api.use('/health', healthRouter({ db }));
  api.use('/auth', authRouter(accounts));
  api.use('/invitations', invitationsRouter(accounts));
  api.use('/members', membersRouter({ db }));
  api.use('/dev/mail', devMailRouter({ inbox: devInbox }));
  api.use('/', formulationRouter());
  api.use('/', libraryRoutes({ db }));
  api.use('/formulas', formulasRouter({ db }));
  api.use('/supply-plans', supplyPlansRouter({ db }));
  api.use('/', labImportsRouter({ db }));
  api.use('/organization-settings', organizationSettingsRouter({ db }));
  api.use('/batch-sheets', batchSheetsRouter({ db }));
  api.use('/batches', batchesRouter({ db }));
  api.use('/ration-checks', rationChecksRouter({ db }));
  api.use('/shares', sharesRouter({ db, mailer: accounts.mailer, publicUrl }));
  api.use(apiNotFound);
  app.use('/api', api);

  if (webProxy) {
    app.use(webProxy);
  } else if (webDist && existsSync(join(webDist, 'index.html'))) {
    app.use(express.static(webDist, { extensions: ['html'], index: 'index.html', maxAge: '1h', setHeaders: noCacheForHtml }));
    // Single-page app: every other GET gets index.html and the router in the page takes over.
    app.use((req, res, next) => (req.method === 'GET' ? res.sendFile(join(webDist, 'index.html'), { headers: { 'cache-control': 'no-cache' } }) : next()));
  }

  app.use(errorHandler);
  return app;
}

function noCacheForHtml(res: express.Response, path: string) {
  // Bundles have content hashes and may be cached; the page that names them must not be.
  if (path.endsWith('.html')) res.setHeader('cache-control', 'no-cache');
}
