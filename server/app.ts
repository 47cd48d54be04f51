import { existsSync } from 'node:fs';
import { join } from 'node:path';
import express, { type Express, type RequestHandler } from 'express';

import type { Db } from './db/client';
import { apiNotFound, errorHandler } from './http/error-handler';
import { healthRouter } from './routes/health';

export type AppOptions = {
  db: Db;
  /** Folder of the exported web app to serve (dist/). Omit to serve the API only. */
  webDist?: string;
  /** In development, everything that is not /api goes to Metro through this proxy. */
  webProxy?: RequestHandler;
};

/** Builds the Express app; tests call it with their own database. */
export function createApp({ db, webDist, webProxy }: AppOptions): Express {
  const app = express();
  app.disable('x-powered-by');
  app.set('trust proxy', 'loopback');

  const api = express.Router();
  api.use(express.json({ limit: '2mb' }));
  api.use('/health', healthRouter({ db }));
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
