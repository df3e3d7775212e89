import path from 'node:path';
import type { Knex } from 'knex';

/** Migrations live in ./migrations as TypeScript; they run under tsx. */
export const migrationConfig: Knex.MigratorConfig = {
  directory: path.resolve('migrations'),
  loadExtensions: ['.ts'],
  tableName: 'knex_migrations',
};

export async function migrateLatest(db: Knex): Promise<string[]> {
  const [, applied] = (await db.migrate.latest(migrationConfig)) as [number, string[]];
  return applied;
}

export async function rollbackAll(db: Knex): Promise<string[]> {
  const [, undone] = (await db.migrate.rollback(migrationConfig, true)) as [number, string[]];
  return undone;
}
