import { Router } from 'express';

import { access } from '../http/access';
import type { DevInbox } from '../mail/dev-inbox';

/** GET /api/dev/mail: what the local fake SMTP server received. Exists only when that inbox runs (never in production). */
export function devMailRouter({ inbox }: { inbox?: DevInbox }): Router {
  const router = Router();
  router.get('/', access.development(!!inbox), (_req, res) => {
    res.json(inbox!.messages());
  });
  return router;
}
