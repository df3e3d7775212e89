import knex, { type Knex } from 'knex';
import pg from 'pg';

// pg returns int8 (COUNT(*)) as strings; counts here stay far below 2^53.
pg.types.setTypeParser(pg.types.builtins.INT8, (v) => Number.parseInt(v, 10));

export function createDb(connectionString: string, maxConnections = 20): Knex {
  return knex({
    client: 'pg',
    connection: { connectionString, connectionTimeoutMillis: 3000 },
    pool: { min: 0, max: maxConnections },
    // Fail fast (503) when the database is down rather than queueing requests for a minute.
    acquireConnectionTimeout: 5000,
  });
}
