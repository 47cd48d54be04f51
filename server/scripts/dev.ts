/**
 * `npm run dev`: the API with live reload of the web app. Express listens on PORT, answers /api and
 * proxies everything else (including the reload websocket) to Metro's dev server on PORT + 2.
 */
import { spawn } from 'node:child_process';
import { createProxyMiddleware } from 'http-proxy-middleware';

import { closeOnSignals, runServer, setUpMail } from '../index';
import { readEnv } from '../env';
import { prepareLocalDatabase } from './local-db';

async function main() {
  const env = readEnv();
  const metroPort = env.PORT + 2;
  const dbUrl = await prepareLocalDatabase(env);

  const metro = spawn('npx', ['expo', 'start', '--web', '--port', String(metroPort)], { stdio: 'inherit', env: { ...process.env, BROWSER: 'none' } });
  const proxy = createProxyMiddleware({ target: `http://127.0.0.1:${metroPort}`, ws: true, changeOrigin: true });
  const mail = await setUpMail(env);
  const running = await runServer({ ...mail, publicUrl: env.PUBLIC_URL, secureCookies: env.PUBLIC_URL?.startsWith('https:'), host: env.HOST, port: env.PORT, dbUrl, webProxy: proxy });
  running.server.on('upgrade', proxy.upgrade);
  console.log(`\nTroughline (development) at ${running.url}; server code changes need a restart (Ctrl-C, npm run dev).`);
  closeOnSignals(async () => {
    metro.kill('SIGTERM');
    await running.close();
    await mail.devInbox?.close();
  });
}

main().catch((error) => {
  console.error(error);
  process.exit(1);
});
