import type { Knex } from 'knex';

const connection = process.env['DATABASE_URL'];
if (!connection) {
  throw new Error('DATABASE_URL is not set (npm start and npm test set it for you)');
}

const config: Knex.Config = {
  client: 'pg',
  connection,
  migrations: { directory: './migrations', extension: 'ts', tableName: 'knex_migrations' },
};

export default config;
