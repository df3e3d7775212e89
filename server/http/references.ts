import type { Knex } from 'knex';
import { HttpError } from './http-error';

/** A climate site or equipment list named in a project or scenario must be the organisation's own (404 otherwise, as for any other item). */
export async function checkReferences(
  db: Knex,
  organizationId: string,
  refs: { climateSiteId?: string | null; equipmentListId?: string | null },
): Promise<void> {
  const checks = [
    { id: refs.climateSiteId, table: 'climate_sites', path: 'climateSiteId', what: 'climate site' },
    { id: refs.equipmentListId, table: 'equipment_lists', path: 'equipmentListId', what: 'equipment list' },
  ];
  for (const c of checks) {
    if (!c.id) continue;
    const found: unknown = await db(c.table).where({ id: c.id, organization_id: organizationId }).first('id');
    if (!found) {
      throw new HttpError(404, 'not_found', `That ${c.what} was not found`, [
        { path: c.path, message: `Choose a ${c.what} of this organisation` },
      ]);
    }
  }
}
