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
  signInLimiter: AttemptLimiter;
  resetLimiter: AttemptLimiter;
};
