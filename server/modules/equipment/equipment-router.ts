import { Router } from 'express';
import type { Knex } from 'knex';
import { z } from 'zod';
import { parseEquipmentCsv, toCsv } from '@shared/equipment/equipment-csv';
import { type EquipmentOption, energyPricesPutSchema, equipmentCsvPreviewSchema, equipmentListInputSchema, equipmentListPatchSchema, equipmentOptionsPutSchema, type EquipmentList, type EquipmentListSummary } from '@shared/equipment/equipment-schemas';
import type { EnergyPrices } from '@shared/money/energy-prices';
import { authorize, orgContext } from '../../http/authorize';
import { HttpError, staleUpdate } from '../../http/http-error';

const listParam = z.object({ listId: z.uuid('Unknown equipment list') });
const listNotFound = () => new HttpError(404, 'not_found', 'That equipment list was not found');

interface ListRow {
  id: string;
  name: string;
  version: number;
  updated_at: Date;
  option_count: number;
  updated_by_name: string | null;
}

const toSummary = (r: ListRow): EquipmentListSummary => ({
  id: r.id,
  name: r.name,
  optionCount: r.option_count,
  version: r.version,
  updatedAt: r.updated_at.toISOString(),
});

function listQuery(db: Knex, organizationId: string) {
  return db('equipment_lists as l')
    .leftJoin('users as u', 'u.id', 'l.updated_by')
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

async function findList(db: Knex, organizationId: string, id: string): Promise<EquipmentList | undefined> {
  const [row] = await listQuery(db, organizationId).andWhere('l.id', id);
  if (!row) return undefined;
  const options = await db('equipment_options')
    .where({ equipment_list_id: id })
    .orderBy('position')
    .select<{ option: EquipmentOption }[]>('option');
  return { ...toSummary(row), options: options.map((o) => o.option) };
}

/** Bumps a list's version only if it is still `version`; 409 (or 404) otherwise. */
async function claimVersion(trx: Knex.Transaction, organizationId: string, id: string, version: number, userId: string) {
  const n = await trx('equipment_lists')
    .where({ id, organization_id: organizationId, version })
    .update({ version: trx.raw('version + 1'), updated_by: userId, updated_at: trx.fn.now() });
  if (n) return;
  const [current] = await listQuery(trx, organizationId).andWhere('l.id', id);
  if (!current) throw listNotFound();
  throw staleUpdate(current.updated_by_name ?? 'Someone', 'equipment list');
}

export function equipmentRouter(db: Knex): Router {
  const router = Router();

  router.get('/equipment-lists', authorize(db, 'org:read'), async (req, res) => {
    const rows = await listQuery(db, orgContext(req).organizationId).orderBy([{ column: 'l.name' }, { column: 'l.id' }]);
    res.json(rows.map(toSummary));
  });

  router.post('/equipment-lists', authorize(db, 'project:write'), async (req, res) => {
    const { name } = equipmentListInputSchema.parse(req.body);
    const { organizationId, user } = orgContext(req);
    const [row] = await db('equipment_lists')
      .insert({ organization_id: organizationId, name, updated_by: user.id })
      .returning<{ id: string }[]>('id');
    const created = await findList(db, organizationId, row?.id ?? '');
    res.status(201).location(`/api/v1/equipment-lists/${created?.id ?? ''}`).json(created);
  });

  router.get('/equipment-lists/:listId', authorize(db, 'org:read'), async (req, res) => {
    const { listId } = listParam.parse(req.params);
    const list = await findList(db, orgContext(req).organizationId, listId);
    if (!list) throw listNotFound();
    res.json(list);
  });

  router.patch('/equipment-lists/:listId', authorize(db, 'project:write'), async (req, res) => {
    const { listId } = listParam.parse(req.params);
    const { version, name } = equipmentListPatchSchema.parse(req.body);
    const { organizationId, user } = orgContext(req);
    await db.transaction(async (trx) => {
      await claimVersion(trx, organizationId, listId, version, user.id);
      await trx('equipment_lists').where({ id: listId }).update({ name });
    });
    res.json(await findList(db, organizationId, listId));
  });

  router.delete('/equipment-lists/:listId', authorize(db, 'project:write'), async (req, res) => {
    const { listId } = listParam.parse(req.params);
    const n = await db('equipment_lists').where({ id: listId, organization_id: orgContext(req).organizationId }).delete();
    if (!n) throw listNotFound();
    res.status(204).end();
  });

  // The whole list of options at once (inline editing saves the table): all or nothing.
  router.put('/equipment-lists/:listId/options', authorize(db, 'project:write'), async (req, res) => {
    const { listId } = listParam.parse(req.params);
    const { version, options } = equipmentOptionsPutSchema.parse(req.body);
    const { organizationId, user } = orgContext(req);
    await db.transaction(async (trx) => {
      await claimVersion(trx, organizationId, listId, version, user.id);
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
    });
    res.json(await findList(db, organizationId, listId));
  });

  router.post('/equipment-lists/:listId/csv-preview', authorize(db, 'project:write'), async (req, res) => {
    const { listId } = listParam.parse(req.params);
    const { csv } = equipmentCsvPreviewSchema.parse(req.body);
    if (!(await findList(db, orgContext(req).organizationId, listId))) throw listNotFound();
    const parsed = parseEquipmentCsv(csv);
    if (!parsed.ok) {
      throw new HttpError(
        400,
        'invalid_file',
        'The file was refused: fix the lines listed and try again. Nothing was imported.',
        parsed.problems.map((p) => ({ path: `line ${p.line}`, message: p.message })),
      );
    }
    res.json({ options: parsed.options });
  });

  router.get('/equipment-lists/:listId/csv', authorize(db, 'org:read'), async (req, res) => {
    const { listId } = listParam.parse(req.params);
    const list = await findList(db, orgContext(req).organizationId, listId);
    if (!list) throw listNotFound();
    const fileName = list.name.replace(/[^A-Za-z0-9 _-]+/g, '').trim().replace(/\s+/g, '-') || 'equipment';
    res
      .type('text/csv; charset=utf-8')
      .attachment(`${fileName}.csv`)
      .send(toCsv(list.options));
  });

  router.get('/energy-prices', authorize(db, 'org:read'), async (req, res) => {
    const row = await db('energy_prices')
      .where({ organization_id: orgContext(req).organizationId })
      .first<{ prices: EnergyPrices; version: number } | undefined>('prices', 'version');
    res.json(row ? { version: row.version, prices: row.prices } : { version: 0, prices: null });
  });

  router.put('/energy-prices', authorize(db, 'project:write'), async (req, res) => {
    const { version, prices } = energyPricesPutSchema.parse(req.body);
    const { organizationId, user } = orgContext(req);
    const stale = async () => {
      const by = await db('energy_prices as e')
        .leftJoin('users as u', 'u.id', 'e.updated_by')
        .where('e.organization_id', organizationId)
        .first<{ name: string | null } | undefined>('u.name');
      return staleUpdate(by?.name ?? 'Someone', 'price list');
    };
    let saved: { version: number }[];
    if (version === 0) {
      saved = await db('energy_prices')
        .insert({ organization_id: organizationId, prices: JSON.stringify(prices), updated_by: user.id })
        .onConflict('organization_id')
        .ignore()
        .returning<{ version: number }[]>('version');
    } else {
      saved = await db('energy_prices')
        .where({ organization_id: organizationId, version })
        .update({ prices: JSON.stringify(prices), version: db.raw('version + 1'), updated_by: user.id, updated_at: db.fn.now() })
        .returning<{ version: number }[]>('version');
    }
    if (!saved[0]) throw await stale();
    res.json({ version: saved[0].version, prices });
  });

  return router;
}
