import { z } from 'zod';
import { rowVersionSchema } from '../api/safe-text';

export const PROJECT_NAME_MAX_LENGTH = 160;

const text = (label: string, max: number) =>
  z
    .string({ error: `Enter the ${label} as text` })
    .trim()
    .max(max, `Use at most ${max} characters for the ${label}`);

const projectFields = {
  name: z
    .string({ error: 'Enter a project name' })
    .trim()
    .min(1, 'Enter a project name')
    .max(PROJECT_NAME_MAX_LENGTH, `Use at most ${PROJECT_NAME_MAX_LENGTH} characters`),
  clientName: text('client name', 160),
  siteAddress: text('site address', 500),
  climateSiteId: z.uuid('Choose a climate site from the list').nullable(),
  equipmentListId: z.uuid('Choose an equipment list from the list').nullable(),
  notes: text('notes', 4000),
};

/** POST /api/v1/projects */
export const projectInputSchema = z.strictObject({
  name: projectFields.name,
  clientName: projectFields.clientName.optional(),
  siteAddress: projectFields.siteAddress.optional(),
  climateSiteId: projectFields.climateSiteId.optional(),
  equipmentListId: projectFields.equipmentListId.optional(),
  notes: projectFields.notes.optional(),
});
export type ProjectInput = z.infer<typeof projectInputSchema>;

/**
 * PATCH /api/v1/projects/:projectId. `version` is the version the change was made from:
 * when someone saved in between, the answer is 409 and nothing is overwritten.
 */
export const projectPatchSchema = z.strictObject({
  version: rowVersionSchema('The version of the project being changed is required'),
  name: projectFields.name.optional(),
  clientName: projectFields.clientName.optional(),
  siteAddress: projectFields.siteAddress.optional(),
  climateSiteId: projectFields.climateSiteId.optional(),
  equipmentListId: projectFields.equipmentListId.optional(),
  notes: projectFields.notes.optional(),
  archived: z.boolean({ error: 'Archived is true or false' }).optional(),
});
export type ProjectPatch = z.infer<typeof projectPatchSchema>;

/** GET /api/v1/projects query */
export const projectListQuerySchema = z.strictObject({
  archived: z.enum(['true', 'false'], { error: 'archived is true or false' }).optional(),
});

export const projectSchema = z.object({
  id: z.uuid(),
  name: z.string(),
  clientName: z.string(),
  siteAddress: z.string(),
  climateSiteId: z.uuid().nullable(),
  climateSiteName: z.string().nullable(),
  equipmentListId: z.uuid().nullable(),
  equipmentListName: z.string().nullable(),
  notes: z.string(),
  archived: z.boolean(),
  version: z.int(),
  createdByName: z.string(),
  updatedByName: z.string(),
  createdAt: z.string(),
  updatedAt: z.string(),
});
export type Project = z.infer<typeof projectSchema>;
export const projectListSchema = z.array(projectSchema);
