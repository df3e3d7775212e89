/** The tables of equipment lists, their options and the organisation's energy prices, with their row mappers. */
import type { Knex } from 'knex';
import type { EquipmentOption } from '@shared/equipment/equipment-schemas';
import type { EquipmentListSummary } from '@shared/equipment/equipment-schemas';
import type { EnergyPrices } from '@shared/money/energy-prices';
import { peopleView } from '../auth/users-repo';

export const TABLES = ['equipment_lists', 'equipment_options', 'energy_prices'] as const;

/**
 * Read-only view for other areas (docs/architecture.md#read-only-views-of-another-areas-tables):
 * every equipment list as a subquery with the columns `id`, `name` and `version` (which moves with every
 * change of the list or its options), to be joined under an alias of the caller's choosing. PostgreSQL
 * folds it into the caller's statement.
 */
export const listsView = (db: Knex) => db('equipment_lists').select('id', 'name', 'version');

/**
 * Read-only view for other areas: each organisation's energy prices as a subquery with the columns
 * `organization_id` and `version` (which moves with every change of the prices).
 */
export const pricesView = (db: Knex) => db('energy_prices').select('organization_id', 'version');

export interface ListRow {
  id: string;
  name: string;
  version: number;
  updated_at: Date;
  option_count: number;
  updated_by_name: string | null;
}

export const toSummary = (r: ListRow): EquipmentListSummary => ({
  id: r.id,
  name: r.name,
  optionCount: r.option_count,
  version: r.version,
  updatedAt: r.updated_at.toISOString(),
});

function listQuery(db: Knex, organizationId: string) {
  return db('equipment_lists as l')
    .leftJoin(peopleView(db).as('u'), 'u.id', 'l.updated_by')
    .where('l.organization_id', organizationId)
    .select<ListRow[]>(
      'l.id',
      'l.name',
      'l.version',
      'l.updated_at',
      'u.name as updated_by_name',
      db.raw('(SELECT count(*)::int FROM equipment_options o WHERE o.equipment_list_id = l.id) AS option_count'),
    );
}

export function listLists(db: Knex, organizationId: string): Promise<ListRow[]> {
  return listQuery(db, organizationId).orderBy([{ column: 'l.name' }, { column: 'l.id' }]);
}

export async function findListRow(db: Knex, organizationId: string, id: string): Promise<ListRow | undefined> {
  const [row] = await listQuery(db, organizationId).andWhere('l.id', id);
  return row;
}

/** The list's name, when it is the organisation's. */
export async function findListName(db: Knex, organizationId: string, id: string): Promise<string | undefined> {
  const row = await db('equipment_lists')
    .where({ id, organization_id: organizationId })
    .first<{ name: string } | undefined>('name');
  return row?.name;
}

/** The list's options in their order, each with its position (as stored: parse before use). */
export function optionsOf(db: Knex, listId: string): Promise<{ position: number; option: unknown }[]> {
  return db('equipment_options')
    .where({ equipment_list_id: listId })
    .orderBy('position')
    .select<{ position: number; option: unknown }[]>('position', 'option');
}

export async function insertList(db: Knex, organizationId: string, name: string, userId: string): Promise<string> {
  const [row] = await db('equipment_lists')
    .insert({ organization_id: organizationId, name, updated_by: userId })
    .returning<{ id: string }[]>('id');
  if (!row) throw new Error('equipment list not created');
  return row.id;
}

/** Bumps a list's version only if it is still `version`; false otherwise. */
export async function claimListVersion(
  trx: Knex.Transaction,
  organizationId: string,
  id: string,
  version: number,
  userId: string,
): Promise<boolean> {
  const n = await trx('equipment_lists')
    .where({ id, organization_id: organizationId, version })
    .update({ version: trx.raw('version + 1'), updated_by: userId, updated_at: trx.fn.now() });
  return n > 0;
}

export async function renameList(db: Knex, id: string, name: string): Promise<void> {
  await db('equipment_lists').where({ id }).update({ name });
}

export async function deleteList(db: Knex, organizationId: string, id: string): Promise<boolean> {
  const n = await db('equipment_lists').where({ id, organization_id: organizationId }).delete();
  return n > 0;
}

export async function replaceOptions(
  trx: Knex.Transaction,
  listId: string,
  options: readonly EquipmentOption[],
): Promise<void> {
  await trx('equipment_options').where({ equipment_list_id: listId }).delete();
  if (options.length > 0) {
    await trx('equipment_options').insert(
      options.map((option, position) => ({
        equipment_list_id: listId,
        position,
        kind: option.kind,
        label: option.label,
        installed_price: option.installedPrice, // a decimal string, stored as numeric
        option: JSON.stringify(option),
      })),
    );
  }
}

/** Whether the list is the organisation's (a project or scenario may name only its own). */
export async function listBelongsTo(db: Knex, organizationId: string, id: string): Promise<boolean> {
  const row: unknown = await db('equipment_lists').where({ id, organization_id: organizationId }).first('id');
  return Boolean(row);
}

/** The organisation's energy prices as stored (parse before use), with their version. */
export function findPrices(
  db: Knex,
  organizationId: string,
): Promise<{ prices: unknown; version: number } | undefined> {
  return db('energy_prices')
    .where({ organization_id: organizationId })
    .first<{ prices: unknown; version: number } | undefined>('prices', 'version');
}

/** Who last changed the organisation's prices (null when that person has no account any more). */
export async function pricesUpdatedByName(db: Knex, organizationId: string): Promise<string | null> {
  const by = await db('energy_prices as e')
    .leftJoin(peopleView(db).as('u'), 'u.id', 'e.updated_by')
    .where('e.organization_id', organizationId)
    .first<{ name: string | null } | undefined>('u.name');
  return by?.name ?? null;
}

/** Stores the first prices of an organisation; no row when another request stored them first. */
export function insertPrices(
  db: Knex,
  organizationId: string,
  prices: EnergyPrices,
  userId: string,
): Promise<{ version: number }[]> {
  return db('energy_prices')
    .insert({ organization_id: organizationId, prices: JSON.stringify(prices), updated_by: userId })
    .onConflict('organization_id')
    .ignore()
    .returning<{ version: number }[]>('version');
}

/** Replaces the prices of `version`; no row when they have changed since. */
export function updatePrices(
  db: Knex,
  organizationId: string,
  version: number,
  prices: EnergyPrices,
  userId: string,
): Promise<{ version: number }[]> {
  return db('energy_prices')
    .where({ organization_id: organizationId, version })
    .update({
      prices: JSON.stringify(prices),
      version: db.raw('version + 1'),
      updated_by: userId,
      updated_at: db.fn.now(),
    })
    .returning<{ version: number }[]>('version');
}
