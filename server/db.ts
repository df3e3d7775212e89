import { createHash } from 'node:crypto';
import knex, { type Knex } from 'knex';
import pg from 'pg';

// pg returns int8 (COUNT(*)) as strings; counts here stay far below 2^53.
pg.types.setTypeParser(pg.types.builtins.INT8, (v) => Number.parseInt(v, 10));

export function createDb(connectionString: string, maxConnections = 8): Knex {
  return knex({
    client: 'pg',
    connection: { connectionString, connectionTimeoutMillis: 3000 },
    pool: { min: 0, max: maxConnections },
    // Fail fast (503) when the database is down rather than queueing requests for a minute.
    acquireConnectionTimeout: 5000,
  });
}

/**
 * Runs `query` as a named prepared statement, so that PostgreSQL parses and plans it once per
 * connection rather than on every call: for the queries every request makes. The name is a hash of
 * the SQL text, so two shapes of a query never share one.
 */
export function prepared<Q extends Knex.QueryBuilder>(query: Q): Q {
  const { sql } = query.toSQL();
  return query.options({ name: 'tr_' + createHash('sha1').update(sql).digest('hex').slice(0, 24) });
}
