/** The `projects` table (the building description is one of its columns) and its row mapper. */
import type { Knex } from 'knex';
import type { Building } from '@shared/building/building-schemas';
import type { Project } from '@shared/projects/project-schemas';
import { prepared } from '../../db';
import { peopleView } from '../auth/users-repo';
import { sitesView } from '../climate/climate-repo';
import { listsView } from '../equipment/equipment-repo';

export const TABLES = ['projects'] as const;

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

/**
 * Read-only view for other areas (docs/architecture.md#read-only-views-of-another-areas-tables):
 * every project as a subquery with the columns `id` and `version` (which moves with every change of the
 * project or its building), to be joined under an alias of the caller's choosing. PostgreSQL folds it
 * into the caller's statement.
 */
export const projectsView = (db: Knex) => db('projects').select('id', 'version');

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

/** Projects with the names shown beside them (people, climate site, equipment list), read in the same query. */
function projectQuery(db: Knex, organizationId: string) {
  return db('projects as p')
    .leftJoin(peopleView(db).as('cu'), 'cu.id', 'p.created_by')
    .leftJoin(peopleView(db).as('uu'), 'uu.id', 'p.updated_by')
    .leftJoin(sitesView(db).as('cs'), 'cs.id', 'p.climate_site_id')
    .leftJoin(listsView(db).as('el'), 'el.id', 'p.equipment_list_id')
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

export async function findProject(db: Knex, organizationId: string, id: string): Promise<Project | undefined> {
  const rows = await prepared(projectQuery(db, organizationId).andWhere('p.id', id));
  return rows[0] && toProject(rows[0]);
}

/** The organisation's projects, last changed first: the archived ones or the others. */
export async function listProjects(db: Knex, organizationId: string, archived: boolean): Promise<Project[]> {
  const query = projectQuery(db, organizationId).orderBy('p.updated_at', 'desc');
  const rows = await (archived ? query.whereNotNull('p.archived_at') : query.whereNull('p.archived_at'));
  return rows.map(toProject);
}

/** The project's references, when it is the organisation's. */
export function findProjectRefs(
  db: Knex,
  organizationId: string,
  id: string,
): Promise<{ id: string; climate_site_id: string | null; equipment_list_id: string | null } | undefined> {
  return db('projects')
    .where({ id, organization_id: organizationId })
    .first<{ id: string; climate_site_id: string | null; equipment_list_id: string | null } | undefined>(
      'id',
      'climate_site_id',
      'equipment_list_id',
    );
}

export interface ProjectWrite {
  name: string;
  clientName: string;
  siteAddress: string;
  climateSiteId: string | null;
  equipmentListId: string | null;
  notes: string;
}

/** Inserts a project; `buildingFrom` copies the building description of another project. */
export async function insertProject(
  db: Knex,
  organizationId: string,
  userId: string,
  input: ProjectWrite,
  buildingFrom?: string,
): Promise<string> {
  const [row] = await db('projects')
    .insert({
      organization_id: organizationId,
      name: input.name,
      client_name: input.clientName,
      site_address: input.siteAddress,
      climate_site_id: input.climateSiteId,
      equipment_list_id: input.equipmentListId,
      ...(buildingFrom === undefined
        ? {}
        : { building: db.raw('(SELECT building FROM projects WHERE id = ?)', [buildingFrom]) }),
      notes: input.notes,
      created_by: userId,
      updated_by: userId,
    })
    .returning<{ id: string }[]>('id');
  if (!row) throw new Error('project not created');
  return row.id;
}

export async function isArchived(db: Knex, organizationId: string, id: string): Promise<boolean> {
  const current = await db('projects')
    .where({ id, organization_id: organizationId })
    .first<{ archived_at: Date | null } | undefined>('archived_at');
  return Boolean(current?.archived_at);
}

/** Applies the patch if the project is still `version` (which then moves by one); false otherwise. */
export async function updateProject(
  db: Knex,
  organizationId: string,
  userId: string,
  id: string,
  version: number,
  patch: Partial<ProjectWrite> & { archived?: boolean },
): Promise<boolean> {
  const row: Record<string, unknown> = { updated_by: userId, updated_at: db.fn.now(), version: db.raw('version + 1') };
  if (patch.name !== undefined) row['name'] = patch.name;
  if (patch.clientName !== undefined) row['client_name'] = patch.clientName;
  if (patch.siteAddress !== undefined) row['site_address'] = patch.siteAddress;
  if (patch.climateSiteId !== undefined) row['climate_site_id'] = patch.climateSiteId;
  if (patch.equipmentListId !== undefined) row['equipment_list_id'] = patch.equipmentListId;
  if (patch.notes !== undefined) row['notes'] = patch.notes;
  if (patch.archived !== undefined) row['archived_at'] = patch.archived ? db.fn.now() : null;
  const n = await db('projects').where({ id, organization_id: organizationId, version }).update(row);
  return n > 0;
}

export async function deleteProject(db: Knex, organizationId: string, id: string): Promise<boolean> {
  const n = await db('projects').where({ id, organization_id: organizationId }).delete();
  return n > 0;
}

export function countActiveProjects(db: Knex, organizationId: string): Promise<number> {
  return db('projects')
    .where({ organization_id: organizationId })
    .whereNull('archived_at')
    .count<{ n: number }[]>('id as n')
    .then((rows) => rows[0]?.n ?? 0);
}

export function findBuilding(
  db: Knex,
  organizationId: string,
  id: string,
): Promise<{ version: number; building: Building | null } | undefined> {
  return db('projects')
    .where({ id, organization_id: organizationId })
    .first<{ version: number; building: Building | null } | undefined>('version', 'building');
}

/** Stores the building if the project is still `version`; the new version, or undefined when it was not. */
export async function updateBuilding(
  db: Knex,
  organizationId: string,
  userId: string,
  id: string,
  version: number,
  building: Building,
): Promise<number | undefined> {
  const updated = await db('projects')
    .where({ id, organization_id: organizationId, version })
    .update({
      building: JSON.stringify(building),
      version: db.raw('version + 1'),
      updated_by: userId,
      updated_at: db.fn.now(),
    })
    .returning<{ version: number }[]>('version');
  return updated[0]?.version;
}

/** What a client report shows of its project. */
export function findReportFacts(
  db: Knex,
  id: string,
): Promise<{ name: string; client_name: string; site_address: string; building: Building | null } | undefined> {
  return db('projects')
    .where({ id })
    .first<{ name: string; client_name: string; site_address: string; building: Building | null } | undefined>(
      'name',
      'client_name',
      'site_address',
      'building',
    );
}
