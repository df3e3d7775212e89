import { z } from 'zod';
import { rowVersionSchema } from '../api/safe-text';
import { energyPricesSchema } from '../money/energy-prices';
import { equipmentOptionSchema } from './equipment-schemas';

export const EQUIPMENT_LIST_NAME_MAX = 160;
export const EQUIPMENT_OPTIONS_MAX = 200;
/** Largest CSV accepted for an import preview, characters. */
export const EQUIPMENT_CSV_MAX_CHARS = 500_000;

const listName = z
  .string({ error: 'Name the equipment list' })
  .trim()
  .min(1, 'Name the equipment list')
  .max(EQUIPMENT_LIST_NAME_MAX, `Use at most ${EQUIPMENT_LIST_NAME_MAX} characters`);
const version = rowVersionSchema('The version being changed is required');

/** POST /api/v1/equipment-lists */
export const equipmentListInputSchema = z.strictObject({ name: listName });

/** PATCH /api/v1/equipment-lists/:listId (rename) */
export const equipmentListPatchSchema = z.strictObject({ version, name: listName });

/**
 * PUT /api/v1/equipment-lists/:listId/options: the whole list of options, as edited inline.
 * Replaces the options in one transaction; 409 `stale_update` when the list changed since `version`.
 */
export const equipmentOptionsPutSchema = z.strictObject({
  version,
  options: z.array(equipmentOptionSchema).max(EQUIPMENT_OPTIONS_MAX, `A list holds at most ${EQUIPMENT_OPTIONS_MAX} options`),
});

/** POST /api/v1/equipment-lists/:listId/csv-preview: parse a CSV without storing anything. */
export const equipmentCsvPreviewSchema = z.strictObject({
  csv: z.string({ error: 'Paste or choose a CSV file' }).min(1, 'The file is empty').max(EQUIPMENT_CSV_MAX_CHARS, 'The file is too large'),
});

/** One row of GET /api/v1/equipment-lists */
export const equipmentListSummarySchema = z.object({
  id: z.uuid(),
  name: z.string(),
  optionCount: z.int(),
  version: z.int(),
  updatedAt: z.string(),
});
export type EquipmentListSummary = z.infer<typeof equipmentListSummarySchema>;

/** GET /api/v1/equipment-lists/:listId (options in their saved order) */
export const equipmentListSchema = equipmentListSummarySchema.extend({
  options: z.array(equipmentOptionSchema),
});
export type EquipmentList = z.infer<typeof equipmentListSchema>;

/** 200 answer of a CSV preview (a refused file answers 400 `invalid_file` with line details). */
export const equipmentCsvPreviewResultSchema = z.object({ options: z.array(equipmentOptionSchema) });

/** GET / PUT /api/v1/energy-prices (PUT body: { version, prices }; version 0 when none saved yet) */
export const energyPricesPutSchema = z.strictObject({ version: rowVersionSchema('The version of the prices being changed is required', 0), prices: energyPricesSchema });
export const energyPricesAnswerSchema = z.object({ version: z.int(), prices: energyPricesSchema.nullable() });
export type EnergyPricesAnswer = z.infer<typeof energyPricesAnswerSchema>;
