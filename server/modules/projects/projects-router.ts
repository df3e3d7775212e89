import { Router } from 'express';
import type { Knex } from 'knex';
import { z } from 'zod';
import { projectInputSchema, projectListQuerySchema, projectPatchSchema } from '@shared/projects/project-schemas';
import { authorize, orgContext } from '../../http/authorize';
import * as projects from './projects-service';

const projectParam = z.object({ projectId: z.uuid('Unknown project') });

export function projectsRouter(db: Knex): Router {
  const router = Router();

  router.get('/', authorize(db, 'org:read'), async (req, res) => {
    const { archived } = projectListQuerySchema.parse(req.query);
    res.json(await projects.listProjects(db, orgContext(req).organizationId, archived === 'true'));
  });

  router.post('/', authorize(db, 'project:write'), async (req, res) => {
    const input = projectInputSchema.parse(req.body);
    const { organizationId, user } = orgContext(req);
    const created = await projects.createProject(db, organizationId, user.id, input);
    res.status(201).location(`/api/v1/projects/${created.id}`).json(created);
  });

  router.get('/:projectId', authorize(db, 'org:read'), async (req, res) => {
    const { projectId } = projectParam.parse(req.params);
    res.json(await projects.getProject(db, orgContext(req).organizationId, projectId));
  });

  router.patch('/:projectId', authorize(db, 'project:write'), async (req, res) => {
    const { projectId } = projectParam.parse(req.params);
    const patch = projectPatchSchema.parse(req.body);
    const { organizationId, user } = orgContext(req);
    res.json(await projects.patchProject(db, organizationId, user.id, projectId, patch));
  });

  router.post('/:projectId/duplicate', authorize(db, 'project:write'), async (req, res) => {
    const { projectId } = projectParam.parse(req.params);
    const { organizationId, user } = orgContext(req);
    const copy = await projects.duplicateProject(db, organizationId, user.id, projectId);
    res.status(201).location(`/api/v1/projects/${copy.id}`).json(copy);
  });

  router.delete('/:projectId', authorize(db, 'project:write'), async (req, res) => {
    const { projectId } = projectParam.parse(req.params);
    await projects.deleteProject(db, orgContext(req).organizationId, projectId);
    res.status(204).end();
  });

  return router;
}
