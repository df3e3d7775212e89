import { Router } from 'express';
import type { Knex } from 'knex';
import { projectInputSchema, type Project } from '@shared/projects/project-schemas';
import { authorize, orgContext } from '../../http/authorize';

interface ProjectRow {
  id: string;
  name: string;
  created_by_name: string | null;
  created_at: Date;
  updated_at: Date;
}

const toProject = (r: ProjectRow): Project => ({
  id: r.id,
  name: r.name,
  createdByName: r.created_by_name ?? 'A former member',
  createdAt: r.created_at.toISOString(),
  updatedAt: r.updated_at.toISOString(),
});

function projectQuery(db: Knex, organizationId: string) {
  return db('projects as p')
    .leftJoin('users as u', 'u.id', 'p.created_by')
    .where('p.organization_id', organizationId)
    .select<ProjectRow[]>('p.id', 'p.name', 'u.name as created_by_name', 'p.created_at', 'p.updated_at');
}

export function projectsRouter(db: Knex): Router {
  const router = Router();

  router.get('/', authorize(db, 'org:read'), async (req, res) => {
    const rows = await projectQuery(db, orgContext(req).organizationId).orderBy('p.updated_at', 'desc');
    res.json(rows.map(toProject));
  });

  router.post('/', authorize(db, 'project:write'), async (req, res) => {
    const input = projectInputSchema.parse(req.body);
    const { organizationId, user } = orgContext(req);
    const [inserted] = await db('projects')
      .insert({ organization_id: organizationId, name: input.name, created_by: user.id })
      .returning<{ id: string }[]>('id');
    const [row] = await projectQuery(db, organizationId).andWhere('p.id', inserted?.id);
    if (!row) throw new Error('created project not found');
    res.status(201).location(`/api/v1/projects/${row.id}`).json(toProject(row));
  });

  return router;
}
