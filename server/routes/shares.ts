import { Router } from 'express';

import { createShareInput, shareTokenParams } from '../../src/shared/schemas/shares';
import { publicBaseUrl } from '../auth/session-middleware';
import type { Db } from '../db/client';
import { createShare, getShare, getShareCsv, listReceived, shareTargets } from '../db/queries/shares';
import { access, requireMembership } from '../http/access';
import type { Mailer } from '../mail/mailer';

/**
 * Results shared with a farm. Sharing needs results:share and a membership in the farm; reading needs
 * results:read-shared and a membership in the receiving organization, whichever one is active in the
 * session (anyone else gets 404).
 */
export function sharesRouter({ db, mailer, publicUrl }: { db: Db; mailer: Mailer; publicUrl?: string }): Router {
  const router = Router();

  router.get('/targets', access.member('results:share'), async (req, res) => {
    const { userId } = requireMembership(req);
    res.json(await shareTargets(db, userId));
  });

  router.post('/', access.member('results:share'), async (req, res) => {
    const { organizationId, userId } = requireMembership(req);
    const input = createShareInput.parse(req.body);
    res.status(201).json(await createShare(db, mailer, { organizationId, userId }, input, publicBaseUrl(req, publicUrl)));
  });

  router.get('/', access.member('results:read-shared'), async (req, res) => {
    const { organizationId } = requireMembership(req);
    res.json(await listReceived(db, organizationId));
  });

  router.get('/:token', access.member('results:read-shared'), async (req, res) => {
    const { userId } = requireMembership(req);
    res.json(await getShare(db, userId, shareTokenParams.parse(req.params).token));
  });

  router.get('/:token/csv', access.member('results:read-shared'), async (req, res) => {
    const { userId } = requireMembership(req);
    const { csv, filename } = await getShareCsv(db, userId, shareTokenParams.parse(req.params).token);
    res.type('text/csv; charset=utf-8').attachment(filename).send(csv);
  });

  return router;
}
