import { Router } from 'express';
import type { Knex } from 'knex';
import { z } from 'zod';
import { toCsv } from '@shared/equipment/equipment-csv';
import {
  energyPricesPutSchema,
  equipmentCsvPreviewSchema,
  equipmentListInputSchema,
  equipmentListPatchSchema,
  equipmentOptionsPutSchema,
} from '@shared/equipment/equipment-schemas';
import { authorize, orgContext } from '../../http/authorize';
import * as equipment from './equipment-service';

const listParam = z.object({ listId: z.uuid('Unknown equipment list') });

export function equipmentRouter(db: Knex): Router {
  const router = Router();

  router.get('/equipment-lists', authorize(db, 'org:read'), async (req, res) => {
    res.json(await equipment.listSummaries(db, orgContext(req).organizationId));
  });

  router.post('/equipment-lists', authorize(db, 'project:write'), async (req, res) => {
    const { name } = equipmentListInputSchema.parse(req.body);
    const { organizationId, user } = orgContext(req);
    const created = await equipment.createList(db, organizationId, user.id, name);
    res
      .status(201)
      .location(`/api/v1/equipment-lists/${created?.id ?? ''}`)
      .json(created);
  });

  router.get('/equipment-lists/:listId', authorize(db, 'org:read'), async (req, res) => {
    const { listId } = listParam.parse(req.params);
    res.json(await equipment.requireList(db, orgContext(req).organizationId, listId));
  });

  router.patch('/equipment-lists/:listId', authorize(db, 'project:write'), async (req, res) => {
    const { listId } = listParam.parse(req.params);
    const { version, name } = equipmentListPatchSchema.parse(req.body);
    const { organizationId, user } = orgContext(req);
    res.json(await equipment.renameList(db, organizationId, user.id, listId, version, name));
  });

  router.delete('/equipment-lists/:listId', authorize(db, 'project:write'), async (req, res) => {
    const { listId } = listParam.parse(req.params);
    await equipment.deleteList(db, orgContext(req).organizationId, listId);
    res.status(204).end();
  });

  // The whole list of options at once (inline editing saves the table): all or nothing.
  router.put('/equipment-lists/:listId/options', authorize(db, 'project:write'), async (req, res) => {
    const { listId } = listParam.parse(req.params);
    const { version, options } = equipmentOptionsPutSchema.parse(req.body);
    const { organizationId, user } = orgContext(req);
    res.json(await equipment.replaceOptions(db, organizationId, user.id, listId, version, options));
  });

  router.post('/equipment-lists/:listId/csv-preview', authorize(db, 'project:write'), async (req, res) => {
    const { listId } = listParam.parse(req.params);
    const { csv } = equipmentCsvPreviewSchema.parse(req.body);
    res.json(await equipment.previewCsv(db, orgContext(req).organizationId, listId, csv));
  });

  router.get('/equipment-lists/:listId/csv', authorize(db, 'org:read'), async (req, res) => {
    const { listId } = listParam.parse(req.params);
    const list = await equipment.requireList(db, orgContext(req).organizationId, listId);
    const fileName =
      list.name
        .replace(/[^A-Za-z0-9 _-]+/g, '')
        .trim()
        .replace(/\s+/g, '-') || 'equipment';
    res.type('text/csv; charset=utf-8').attachment(`${fileName}.csv`).send(toCsv(list.options));
  });

  router.get('/energy-prices', authorize(db, 'org:read'), async (req, res) => {
    res.json(await equipment.currentPrices(db, orgContext(req).organizationId));
  });

  router.put('/energy-prices', authorize(db, 'project:write'), async (req, res) => {
    const { version, prices } = energyPricesPutSchema.parse(req.body);
    const { organizationId, user } = orgContext(req);
    res.json(await equipment.savePrices(db, organizationId, user.id, version, prices));
  });

  return router;
}
