import { z } from 'zod';

export const PROJECT_NAME_MAX_LENGTH = 160;

/** POST /api/v1/projects (the project's building, climate and equipment come in later sections) */
export const projectInputSchema = z.strictObject({
  name: z
    .string({ error: 'Enter a project name' })
    .trim()
    .min(1, 'Enter a project name')
    .max(PROJECT_NAME_MAX_LENGTH, `Use at most ${PROJECT_NAME_MAX_LENGTH} characters`),
});
export type ProjectInput = z.infer<typeof projectInputSchema>;

export const projectSchema = z.object({
  id: z.uuid(),
  name: z.string(),
  createdByName: z.string(),
  createdAt: z.string(),
  updatedAt: z.string(),
});
export type Project = z.infer<typeof projectSchema>;
export const projectListSchema = z.array(projectSchema);
