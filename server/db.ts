import knex, { type Knex } from 'knex';
import pg from 'pg';

// pg returns int8 (COUNT(*)) as strings; counts here stay far below 2^53.
pg.types.setTypeParser(pg.types.builtins.INT8, (v) => Number.parseInt(v, 10));

export function createDb(connectionString: string, maxConnections = 10): Knex {
  return knex({
    client: 'pg',
    connection: { connectionString },
    pool: { min: 0, max: maxConnections },
  });
}
