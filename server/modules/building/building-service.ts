/**
 * A project's building description (envelope, ventilation, indoor design temperature): read and
 * replaced whole, against the project's version. It is stored with the project, through the
 * projects area's functions.
 */
import type { Knex } from 'knex';
import type { Building } from '@shared/building/building-schemas';
import { findBuilding, projectNotFound, staleProject, updateBuilding } from '../projects/projects-service';

export async function getBuilding(
  db: Knex,
  organizationId: string,
  projectId: string,
): Promise<{ version: number; building: Building | null }> {
  const row = await findBuilding(db, organizationId, projectId);
  if (!row) throw projectNotFound();
  return { version: row.version, building: row.building };
}

/** Replaces the building if the project is still `version`; 409 naming who changed it otherwise (404 when it is gone). */
export async function putBuilding(
  db: Knex,
  organizationId: string,
  userId: string,
  projectId: string,
  version: number,
  building: Building,
): Promise<{ version: number; building: Building }> {
  const next = await updateBuilding(db, organizationId, userId, projectId, version, building);
  if (next === undefined) throw await staleProject(db, organizationId, projectId);
  return { version: next, building };
}
