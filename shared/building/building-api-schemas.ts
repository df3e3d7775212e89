import { z } from 'zod';
import { rowVersionSchema } from '../api/safe-text';
import { buildingSchema } from './building-schemas';

/**
 * GET /api/v1/projects/:projectId/building → { version, building } (building null until saved).
 * PUT the same shape with the project's `version`: 409 `stale_update` when the project changed since.
 */
export const projectBuildingPutSchema = z.strictObject({
  version: rowVersionSchema('The version of the project being changed is required'),
  building: buildingSchema,
});
export const projectBuildingAnswerSchema = z.object({
  version: z.int(),
  building: buildingSchema.nullable(),
});
export type ProjectBuildingAnswer = z.infer<typeof projectBuildingAnswerSchema>;
