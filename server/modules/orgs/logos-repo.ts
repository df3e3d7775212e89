/** The organisation's logo for reports: one row of `organization_logos` per organisation. */
import type { Knex } from 'knex';

export const TABLES = ['organization_logos'] as const;

export interface StoredLogo {
  contentType: string;
  content: Buffer;
}

export async function findLogo(db: Knex, organizationId: string): Promise<StoredLogo | null> {
  const row = await db('organization_logos')
    .where({ organization_id: organizationId })
    .first<{ content_type: string; content: Buffer } | undefined>('content_type', 'content');
  return row ? { contentType: row.content_type, content: row.content } : null;
}

export async function hasLogo(db: Knex, organizationId: string): Promise<boolean> {
  const row: unknown = await db('organization_logos')
    .where({ organization_id: organizationId })
    .first('organization_id');
  return Boolean(row);
}

export async function saveLogo(db: Knex, organizationId: string, logo: StoredLogo): Promise<void> {
  await db('organization_logos')
    .insert({
      organization_id: organizationId,
      content_type: logo.contentType,
      content: logo.content,
      updated_at: db.fn.now(),
    })
    .onConflict('organization_id')
    .merge();
}

export async function deleteLogo(db: Knex, organizationId: string): Promise<void> {
  await db('organization_logos').where({ organization_id: organizationId }).delete();
}
