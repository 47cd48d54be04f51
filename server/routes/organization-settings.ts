import { Router } from 'express';

import { organizationSettingsInput } from '../../src/shared/schemas/organization-settings';
import type { Db } from '../db/client';
import { getOrganizationSettings, saveOrganizationSettings } from '../db/queries/organization-settings';
import { access, requireMembership } from '../http/access';

/** Units and currency of the active organization: every member reads them, the owner changes them. */
export function organizationSettingsRouter({ db }: { db: Db }): Router {
  const router = Router();

  router.get('/', access.member('members:read'), async (req, res) => {
    const { organizationId } = requireMembership(req);
    res.json(await getOrganizationSettings(db, organizationId));
  });

  router.put('/', access.member('settings:manage'), async (req, res) => {
    const { organizationId } = requireMembership(req);
    await saveOrganizationSettings(db, organizationId, organizationSettingsInput.parse(req.body));
    res.json(await getOrganizationSettings(db, organizationId));
  });

  return router;
}
