import { createApp, type AppOptions } from '../../server/app';
import { startDevInbox, type DevInbox } from '../../server/mail/dev-inbox';
import { createSmtpMailer } from '../../server/mail/mailer';
import { createTestDatabase, type TestDatabase } from './db';
import { listen, type TestServer } from './http';

export type TestApp = { database: TestDatabase; server: TestServer; inbox: DevInbox; close: () => Promise<void> };

/** A fresh database, a fake SMTP inbox and the whole app on a free loopback port. */
export async function startTestApp(label: string, options: Partial<AppOptions> = {}): Promise<TestApp> {
  const database = await createTestDatabase(label);
  const inbox = await startDevInbox(0);
  const mailer = createSmtpMailer(`smtp://127.0.0.1:${inbox.port}`, 'Troughline <no-reply@troughline.invalid>');
  const app = createApp({ db: database.db, mailer, devInbox: inbox, ...options });
  const server = await listen(app);
  return {
    database,
    server,
    inbox,
    close: async () => {
      await server.close();
      await inbox.close();
      await database.drop();
    },
  };
}

/** Waits for a message to arrive in the fake inbox (SMTP delivery is asynchronous). */
export async function waitForMail(inbox: DevInbox, match: (m: ReturnType<DevInbox['messages']>[number]) => boolean, timeoutMs = 5000) {
  const deadline = Date.now() + timeoutMs;
  while (Date.now() < deadline) {
    const found = inbox.messages().find(match);
    if (found) return found;
    await new Promise((resolve) => setTimeout(resolve, 50));
  }
  throw new Error('No matching e-mail arrived in the development inbox.');
}
