/**
 * Projects of an organisation: the one guard that a project belongs to the caller's organisation
 * (404 otherwise), the references a project or scenario may name, and the versioned edits.
 */
import type { Knex } from 'knex';
import type { Project, ProjectInput, ProjectPatch } from '@shared/projects/project-schemas';
import { HttpError, staleUpdate } from '../../http/http-error';
import { assertCanAddProject } from '../billing/plan-limits';
import { siteBelongsTo } from '../climate/climate-repo';
import { listBelongsTo } from '../equipment/equipment-service';
import * as repo from './projects-repo';

export const projectNotFound = () => new HttpError(404, 'not_found', 'That project was not found');

/** The project with its references when it belongs to the organisation; 404 otherwise (whether it exists elsewhere or not). */
export async function projectInOrganization(
  db: Knex,
  organizationId: string,
  projectId: string,
): Promise<{ id: string; climateSiteId: string | null; equipmentListId: string | null }> {
  const p = await repo.findProjectRefs(db, organizationId, projectId);
  if (!p) throw projectNotFound();
  return { id: p.id, climateSiteId: p.climate_site_id, equipmentListId: p.equipment_list_id };
}

/** A climate site or equipment list named in a project or scenario must be the organisation's own (404 otherwise, as for any other item). */
export async function checkReferences(
  db: Knex,
  organizationId: string,
  refs: { climateSiteId?: string | null; equipmentListId?: string | null },
): Promise<void> {
  const checks = [
    { id: refs.climateSiteId, belongs: siteBelongsTo, path: 'climateSiteId', what: 'climate site' },
    { id: refs.equipmentListId, belongs: listBelongsTo, path: 'equipmentListId', what: 'equipment list' },
  ];
  for (const c of checks) {
    if (!c.id) continue;
    if (!(await c.belongs(db, organizationId, c.id))) {
      throw new HttpError(404, 'not_found', `That ${c.what} was not found`, [
        { path: c.path, message: `Choose a ${c.what} of this organisation` },
      ]);
    }
  }
}

export function listProjects(db: Knex, organizationId: string, archived: boolean): Promise<Project[]> {
  return repo.listProjects(db, organizationId, archived);
}

export async function getProject(db: Knex, organizationId: string, projectId: string): Promise<Project> {
  const project = await repo.findProject(db, organizationId, projectId);
  if (!project) throw projectNotFound();
  return project;
}

export async function createProject(
  db: Knex,
  organizationId: string,
  userId: string,
  input: ProjectInput,
): Promise<Project> {
  await checkReferences(db, organizationId, input);
  const id = await db.transaction(async (trx) => {
    await assertCanAddProject(trx, organizationId);
    return repo.insertProject(trx, organizationId, userId, {
      name: input.name,
      clientName: input.clientName ?? '',
      siteAddress: input.siteAddress ?? '',
      climateSiteId: input.climateSiteId ?? null,
      equipmentListId: input.equipmentListId ?? null,
      notes: input.notes ?? '',
    });
  });
  const created = await repo.findProject(db, organizationId, id);
  if (!created) throw new Error('created project not found');
  return created;
}

/** 409 naming who changed the project since `version` (404 when it is gone). */
export async function staleProject(db: Knex, organizationId: string, projectId: string): Promise<HttpError> {
  const current = await repo.findProject(db, organizationId, projectId);
  if (!current) return projectNotFound();
  return staleUpdate(current.updatedByName, 'project');
}

export async function patchProject(
  db: Knex,
  organizationId: string,
  userId: string,
  projectId: string,
  patch: ProjectPatch,
): Promise<Project | undefined> {
  await checkReferences(db, organizationId, patch);
  const { version, ...changes } = patch;
  // Optimistic concurrency: the update applies only to the version the user was looking at.
  // Bringing a project back from the archive takes a place on the plan like a new one.
  const updated = await db.transaction(async (trx) => {
    if (patch.archived === false && (await repo.isArchived(trx, organizationId, projectId)))
      await assertCanAddProject(trx, organizationId);
    return repo.updateProject(trx, organizationId, userId, projectId, version, changes);
  });
  if (!updated) throw await staleProject(db, organizationId, projectId);
  return repo.findProject(db, organizationId, projectId);
}

export async function duplicateProject(
  db: Knex,
  organizationId: string,
  userId: string,
  projectId: string,
): Promise<Project> {
  const source = await getProject(db, organizationId, projectId);
  const id = await db.transaction(async (trx) => {
    await assertCanAddProject(trx, organizationId);
    return repo.insertProject(
      trx,
      organizationId,
      userId,
      {
        name: `${source.name} (copy)`.slice(0, 160),
        clientName: source.clientName,
        siteAddress: source.siteAddress,
        climateSiteId: source.climateSiteId,
        equipmentListId: source.equipmentListId,
        notes: source.notes,
      },
      source.id,
    );
  });
  const copy = await repo.findProject(db, organizationId, id);
  if (!copy) throw new Error('duplicated project not found');
  return copy;
}

export async function deleteProject(db: Knex, organizationId: string, projectId: string): Promise<void> {
  if (!(await repo.deleteProject(db, organizationId, projectId))) throw projectNotFound();
}

export const countActiveProjects = repo.countActiveProjects;
export const findReportFacts = repo.findReportFacts;
export const findBuilding = repo.findBuilding;
export const updateBuilding = repo.updateBuilding;
