/** /api/v1/projects/:projectId/building: the project's building description. */
import { Router } from 'express';
import type { Knex } from 'knex';
import { z } from 'zod';
import { projectBuildingPutSchema } from '@shared/building/building-schemas';
import { authorize, orgContext } from '../../http/authorize';
import * as building from './building-service';

const projectParam = z.object({ projectId: z.uuid('Unknown project') });

export function buildingRouter(db: Knex): Router {
  const router = Router();

  router.get('/:projectId/building', authorize(db, 'org:read'), async (req, res) => {
    const { projectId } = projectParam.parse(req.params);
    res.json(await building.getBuilding(db, orgContext(req).organizationId, projectId));
  });

  router.put('/:projectId/building', authorize(db, 'project:write'), async (req, res) => {
    const { projectId } = projectParam.parse(req.params);
    const { version, building: input } = projectBuildingPutSchema.parse(req.body);
    const { organizationId, user } = orgContext(req);
    res.json(await building.putBuilding(db, organizationId, user.id, projectId, version, input));
  });

  return router;
}
