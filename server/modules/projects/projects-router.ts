import { Router } from 'express';
import type { Knex } from 'knex';
import { z } from 'zod';
import {
  projectInputSchema,
  projectListQuerySchema,
  projectPatchSchema,
  type Project,
} from '@shared/projects/project-schemas';
import { projectBuildingPutSchema, type Building } from '@shared/building/building-schemas';
import { authorize, orgContext } from '../../http/authorize';
import { HttpError, staleUpdate } from '../../http/http-error';
import { prepared } from '../../db';
import { assertCanAddProject } from '../billing/plan-limits';
import { checkReferences } from '../../http/references';

interface ProjectRow {
  id: string;
  name: string;
  client_name: string;
  site_address: string;
  climate_site_id: string | null;
  climate_site_name: string | null;
  equipment_list_id: string | null;
  equipment_list_name: string | null;
  notes: string;
  archived_at: Date | null;
  version: number;
  created_by_name: string | null;
  updated_by_name: string | null;
  created_at: Date;
  updated_at: Date;
}

const FORMER = 'A former member';

const toProject = (r: ProjectRow): Project => ({
  id: r.id,
  name: r.name,
  clientName: r.client_name,
  siteAddress: r.site_address,
  climateSiteId: r.climate_site_id,
  climateSiteName: r.climate_site_name,
  equipmentListId: r.equipment_list_id,
  equipmentListName: r.equipment_list_name,
  notes: r.notes,
  archived: r.archived_at !== null,
  version: r.version,
  createdByName: r.created_by_name ?? FORMER,
  updatedByName: r.updated_by_name ?? r.created_by_name ?? FORMER,
  createdAt: r.created_at.toISOString(),
  updatedAt: r.updated_at.toISOString(),
});

function projectQuery(db: Knex, organizationId: string) {
  return db('projects as p')
    .leftJoin('users as cu', 'cu.id', 'p.created_by')
    .leftJoin('users as uu', 'uu.id', 'p.updated_by')
    .leftJoin('climate_sites as cs', 'cs.id', 'p.climate_site_id')
    .leftJoin('equipment_lists as el', 'el.id', 'p.equipment_list_id')
    .where('p.organization_id', organizationId)
    .select<ProjectRow[]>(
      'p.id',
      'p.name',
      'p.client_name',
      'p.site_address',
      'p.climate_site_id',
      'cs.name as climate_site_name',
      'p.equipment_list_id',
      'el.name as equipment_list_name',
      'p.notes',
      'p.archived_at',
      'p.version',
      'cu.name as created_by_name',
      'uu.name as updated_by_name',
      'p.created_at',
      'p.updated_at',
    );
}

async function findProject(db: Knex, organizationId: string, id: string): Promise<Project | undefined> {
  const rows = await prepared(projectQuery(db, organizationId).andWhere('p.id', id));
  return rows[0] && toProject(rows[0]);
}

const projectParam = z.object({ projectId: z.uuid('Unknown project') });
const notFound = () => new HttpError(404, 'not_found', 'That project was not found');

export function projectsRouter(db: Knex): Router {
  const router = Router();

  router.get('/', authorize(db, 'org:read'), async (req, res) => {
    const { archived } = projectListQuerySchema.parse(req.query);
    const query = projectQuery(db, orgContext(req).organizationId).orderBy('p.updated_at', 'desc');
    const rows = await (archived === 'true' ? query.whereNotNull('p.archived_at') : query.whereNull('p.archived_at'));
    res.json(rows.map(toProject));
  });

  router.post('/', authorize(db, 'project:write'), async (req, res) => {
    const input = projectInputSchema.parse(req.body);
    const { organizationId, user } = orgContext(req);
    await checkReferences(db, organizationId, input);
    const [inserted] = await db.transaction(async (trx) => {
      await assertCanAddProject(trx, organizationId);
      return trx('projects')
        .insert({
          organization_id: organizationId,
          name: input.name,
          client_name: input.clientName ?? '',
          site_address: input.siteAddress ?? '',
          climate_site_id: input.climateSiteId ?? null,
          equipment_list_id: input.equipmentListId ?? null,
          notes: input.notes ?? '',
          created_by: user.id,
          updated_by: user.id,
        })
        .returning<{ id: string }[]>('id');
    });
    const created = await findProject(db, organizationId, inserted?.id ?? '');
    if (!created) throw new Error('created project not found');
    res.status(201).location(`/api/v1/projects/${created.id}`).json(created);
  });

  router.get('/:projectId', authorize(db, 'org:read'), async (req, res) => {
    const { projectId } = projectParam.parse(req.params);
    const project = await findProject(db, orgContext(req).organizationId, projectId);
    if (!project) throw notFound();
    res.json(project);
  });

  router.patch('/:projectId', authorize(db, 'project:write'), async (req, res) => {
    const { projectId } = projectParam.parse(req.params);
    const patch = projectPatchSchema.parse(req.body);
    const { organizationId, user } = orgContext(req);
    await checkReferences(db, organizationId, patch);
    const row: Record<string, unknown> = {
      updated_by: user.id,
      updated_at: db.fn.now(),
      version: db.raw('version + 1'),
    };
    if (patch.name !== undefined) row['name'] = patch.name;
    if (patch.clientName !== undefined) row['client_name'] = patch.clientName;
    if (patch.siteAddress !== undefined) row['site_address'] = patch.siteAddress;
    if (patch.climateSiteId !== undefined) row['climate_site_id'] = patch.climateSiteId;
    if (patch.equipmentListId !== undefined) row['equipment_list_id'] = patch.equipmentListId;
    if (patch.notes !== undefined) row['notes'] = patch.notes;
    if (patch.archived !== undefined) row['archived_at'] = patch.archived ? db.fn.now() : null;
    // Optimistic concurrency: the update applies only to the version the user was looking at.
    // Bringing a project back from the archive takes a place on the plan like a new one.
    const updated = await db.transaction(async (trx): Promise<number> => {
      if (patch.archived === false) {
        const current = await trx('projects')
          .where({ id: projectId, organization_id: organizationId })
          .first<{ archived_at: Date | null } | undefined>('archived_at');
        if (current?.archived_at) await assertCanAddProject(trx, organizationId);
      }
      return trx('projects')
        .where({ id: projectId, organization_id: organizationId, version: patch.version })
        .update(row);
    });
    if (!updated) {
      const current = await findProject(db, organizationId, projectId);
      if (!current) throw notFound();
      throw staleUpdate(current.updatedByName, 'project');
    }
    res.json(await findProject(db, organizationId, projectId));
  });

  router.get('/:projectId/building', authorize(db, 'org:read'), async (req, res) => {
    const { projectId } = projectParam.parse(req.params);
    const row = await db('projects')
      .where({ id: projectId, organization_id: orgContext(req).organizationId })
      .first<{ version: number; building: Building | null } | undefined>('version', 'building');
    if (!row) throw notFound();
    res.json({ version: row.version, building: row.building });
  });

  router.put('/:projectId/building', authorize(db, 'project:write'), async (req, res) => {
    const { projectId } = projectParam.parse(req.params);
    const { version, building } = projectBuildingPutSchema.parse(req.body);
    const { organizationId, user } = orgContext(req);
    const updated = await db('projects')
      .where({ id: projectId, organization_id: organizationId, version })
      .update({
        building: JSON.stringify(building),
        version: db.raw('version + 1'),
        updated_by: user.id,
        updated_at: db.fn.now(),
      })
      .returning<{ version: number }[]>('version');
    if (!updated[0]) {
      const current = await findProject(db, organizationId, projectId);
      if (!current) throw notFound();
      throw staleUpdate(current.updatedByName, 'project');
    }
    res.json({ version: updated[0].version, building });
  });

  router.post('/:projectId/duplicate', authorize(db, 'project:write'), async (req, res) => {
    const { projectId } = projectParam.parse(req.params);
    const { organizationId, user } = orgContext(req);
    const source = await findProject(db, organizationId, projectId);
    if (!source) throw notFound();
    const [inserted] = await db.transaction(async (trx) => {
      await assertCanAddProject(trx, organizationId);
      return trx('projects')
        .insert({
          organization_id: organizationId,
          name: `${source.name} (copy)`.slice(0, 160),
          client_name: source.clientName,
          site_address: source.siteAddress,
          climate_site_id: source.climateSiteId,
          equipment_list_id: source.equipmentListId,
          building: trx.raw('(SELECT building FROM projects WHERE id = ?)', [source.id]),
          notes: source.notes,
          created_by: user.id,
          updated_by: user.id,
        })
        .returning<{ id: string }[]>('id');
    });
    const copy = await findProject(db, organizationId, inserted?.id ?? '');
    if (!copy) throw new Error('duplicated project not found');
    res.status(201).location(`/api/v1/projects/${copy.id}`).json(copy);
  });

  router.delete('/:projectId', authorize(db, 'project:write'), async (req, res) => {
    const { projectId } = projectParam.parse(req.params);
    const n = await db('projects')
      .where({ id: projectId, organization_id: orgContext(req).organizationId })
      .delete();
    if (!n) throw notFound();
    res.status(204).end();
  });

  return router;
}
