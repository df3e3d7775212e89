/** GET /api/v1/audit: the audit log, for owners. */
import { Router } from 'express';
import type { Knex } from 'knex';
import { authorize, orgContext } from '../../http/authorize';
import { recentEvents } from './audit-service';

export function auditRouter(db: Knex): Router {
  const router = Router();
  router.get('/audit', authorize(db, 'member:manage'), async (req, res) => {
    res.json(await recentEvents(db, orgContext(req).organizationId));
  });
  return router;
}
