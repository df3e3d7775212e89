/** Equipment lists (versioned: a stale write answers 409 naming who changed it) and the organisation's energy prices. */
import type { Knex } from 'knex';
import { parseEquipmentCsv } from '@shared/equipment/equipment-csv';
import type { EquipmentOption } from '@shared/equipment/equipment-schemas';
import type { EquipmentList, EquipmentListSummary } from '@shared/equipment/equipment-schemas';
import { energyPricesSchema, type EnergyPrices } from '@shared/money/energy-prices';
import { HttpError, staleUpdate } from '../../http/http-error';
import * as repo from './equipment-repo';

export const listNotFound = () => new HttpError(404, 'not_found', 'That equipment list was not found');

export async function listSummaries(db: Knex, organizationId: string): Promise<EquipmentListSummary[]> {
  return (await repo.listLists(db, organizationId)).map(repo.toSummary);
}

export async function findList(db: Knex, organizationId: string, id: string): Promise<EquipmentList | undefined> {
  const row = await repo.findListRow(db, organizationId, id);
  if (!row) return undefined;
  const options = await repo.optionsOf(db, id);
  return { ...repo.toSummary(row), options: options.map((o) => o.option as EquipmentOption) };
}

/** The list, or 404. */
export async function requireList(db: Knex, organizationId: string, id: string): Promise<EquipmentList> {
  const list = await findList(db, organizationId, id);
  if (!list) throw listNotFound();
  return list;
}

export async function createList(
  db: Knex,
  organizationId: string,
  userId: string,
  name: string,
): Promise<EquipmentList | undefined> {
  const id = await repo.insertList(db, organizationId, name, userId);
  return findList(db, organizationId, id);
}

/** Bumps a list's version only if it is still `version`; 409 (or 404) otherwise. */
async function claimVersion(
  trx: Knex.Transaction,
  organizationId: string,
  id: string,
  version: number,
  userId: string,
) {
  if (await repo.claimListVersion(trx, organizationId, id, version, userId)) return;
  const current = await repo.findListRow(trx, organizationId, id);
  if (!current) throw listNotFound();
  throw staleUpdate(current.updated_by_name ?? 'Someone', 'equipment list');
}

export async function renameList(
  db: Knex,
  organizationId: string,
  userId: string,
  id: string,
  version: number,
  name: string,
): Promise<EquipmentList | undefined> {
  await db.transaction(async (trx) => {
    await claimVersion(trx, organizationId, id, version, userId);
    await repo.renameList(trx, id, name);
  });
  return findList(db, organizationId, id);
}

export async function deleteList(db: Knex, organizationId: string, id: string): Promise<void> {
  if (!(await repo.deleteList(db, organizationId, id))) throw listNotFound();
}

/** The whole list of options at once (inline editing saves the table): all or nothing. */
export async function replaceOptions(
  db: Knex,
  organizationId: string,
  userId: string,
  id: string,
  version: number,
  options: readonly EquipmentOption[],
): Promise<EquipmentList | undefined> {
  await db.transaction(async (trx) => {
    await claimVersion(trx, organizationId, id, version, userId);
    await repo.replaceOptions(trx, id, options);
  });
  return findList(db, organizationId, id);
}

/** The options read from a CSV file, or 400 with the lines to fix (nothing is stored either way). */
export async function previewCsv(
  db: Knex,
  organizationId: string,
  id: string,
  csv: string,
): Promise<{ options: EquipmentOption[] }> {
  await requireList(db, organizationId, id);
  const parsed = parseEquipmentCsv(csv);
  if (!parsed.ok) {
    throw new HttpError(
      400,
      'invalid_file',
      'The file was refused: fix the lines listed and try again. Nothing was imported.',
      parsed.problems.map((p) => ({ path: `line ${p.line}`, message: p.message })),
    );
  }
  return { options: parsed.options };
}

/** The organisation's prices as stored, with their version (0 and null before the first save). */
export async function currentPrices(
  db: Knex,
  organizationId: string,
): Promise<{ version: number; prices: EnergyPrices | null }> {
  const row = await repo.findPrices(db, organizationId);
  return row ? { version: row.version, prices: row.prices as EnergyPrices } : { version: 0, prices: null };
}

/** The organisation's prices, parsed (null when there are none, or they no longer read as prices). */
export async function organizationPrices(db: Knex, organizationId: string): Promise<EnergyPrices | null> {
  const row = await repo.findPrices(db, organizationId);
  const parsed = energyPricesSchema.safeParse(row?.prices);
  return parsed.success ? parsed.data : null;
}

/** Saves the organisation's prices over `version` (0: the first save); 409 naming who changed them otherwise. */
export async function savePrices(
  db: Knex,
  organizationId: string,
  userId: string,
  version: number,
  prices: EnergyPrices,
): Promise<{ version: number; prices: EnergyPrices }> {
  const saved =
    version === 0
      ? await repo.insertPrices(db, organizationId, prices, userId)
      : await repo.updatePrices(db, organizationId, version, prices, userId);
  if (!saved[0]) throw staleUpdate((await repo.pricesUpdatedByName(db, organizationId)) ?? 'Someone', 'price list');
  return { version: saved[0].version, prices };
}

/** The list's name and stored options, when it is the organisation's (what a sweep is put together from). */
export async function listForSweep(
  db: Knex,
  organizationId: string,
  id: string,
): Promise<{ name: string; options: { position: number; option: unknown }[] } | undefined> {
  const name = await repo.findListName(db, organizationId, id);
  return name === undefined ? undefined : { name, options: await repo.optionsOf(db, id) };
}

export const listBelongsTo = repo.listBelongsTo;

/** The organisation's prices as stored, unparsed (undefined before the first save). */
export async function storedPrices(db: Knex, organizationId: string): Promise<unknown> {
  return (await repo.findPrices(db, organizationId))?.prices;
}
