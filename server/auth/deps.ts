import type { Db } from '../db/client';
import type { Mailer } from '../mail/mailer';
import type { TroughlineLucia } from './lucia';
import type { AttemptLimiter } from './rate-limit';

/** What the accounts routes need; built once in createApp. */
export type AccountsDeps = {
  db: Db;
  lucia: TroughlineLucia;
  mailer: Mailer;
  /** Base of links in e-mails; defaults to the address each request came to. */
  publicUrl?: string;
  /** Failed sign-ins per address and client. */
  signInLimiter: AttemptLimiter;
  /** Failed sign-ins per client, whatever the address (spraying many accounts). */
  clientLimiter: AttemptLimiter;
  resetLimiter: AttemptLimiter;
};
