/**
 * Reads one row of large binary columns with `COPY (…) TO STDOUT (FORMAT binary)`: the bytes come
 * as PostgreSQL stores them, streamed, instead of as hex text twice their size that the driver then
 * decodes (for a 3.7 MB sweep index about 12 ms instead of 50–130 ms; see README, performance).
 *
 * COPY takes no bind parameters, so the values are quoted with the driver's `escapeLiteral`; the
 * query text itself must come from code, never from a user.
 */
import type { Knex } from 'knex';
import pg from 'pg';
import { to as copyTo } from 'pg-copy-streams';

/** The 11-byte signature, 4 bytes of flags and 4 of header-extension length of a binary COPY (PostgreSQL docs, COPY, "Binary Format"). */
const SIGNATURE = Buffer.from('PGCOPY\n\xff\r\n\0', 'latin1');

interface CopyConnection {
  query<T>(stream: T): T;
}

/**
 * The fields of the first row `sql` returns (null for SQL NULL), or undefined when it returns no
 * row. `$1`, `$2`, … in `sql` are replaced by the quoted `values`.
 */
export async function copyOutFirstRow(
  db: Knex,
  sql: string,
  values: readonly string[],
): Promise<(Buffer | null)[] | undefined> {
  const text = sql.replace(/\$(\d+)/g, (_, n: string) => {
    const value = values[Number(n) - 1];
    if (value === undefined) throw new Error(`copyOutFirstRow: no value for $${n}`);
    return pg.escapeLiteral(value);
  });
  const client = db.client as {
    acquireConnection(): Promise<CopyConnection>;
    releaseConnection(c: CopyConnection): Promise<void>;
  };
  const connection = await client.acquireConnection();
  const chunks: Buffer[] = [];
  try {
    await new Promise<void>((resolve, reject) => {
      const stream = connection.query(copyTo(`COPY (${text}) TO STDOUT (FORMAT binary)`));
      stream.on('data', (chunk: Buffer) => chunks.push(chunk));
      stream.on('end', () => resolve());
      stream.on('error', reject);
    });
  } finally {
    await client.releaseConnection(connection);
  }
  return firstRowOfBinaryCopy(Buffer.concat(chunks));
}

/** Parses the first tuple of a binary COPY stream. Exported for its tests. */
export function firstRowOfBinaryCopy(data: Buffer): (Buffer | null)[] | undefined {
  if (data.length < 19 || !data.subarray(0, 11).equals(SIGNATURE)) throw new Error('not a binary COPY stream');
  let at = 15;
  const extension = data.readUInt32BE(at);
  at += 4 + extension;
  const fieldCount = data.readInt16BE(at);
  at += 2;
  if (fieldCount === -1) return undefined; // the trailer: no rows
  const fields: (Buffer | null)[] = [];
  for (let i = 0; i < fieldCount; i++) {
    const length = data.readInt32BE(at);
    at += 4;
    if (length === -1) {
      fields.push(null);
      continue;
    }
    if (at + length > data.length) throw new Error('binary COPY stream cut short');
    fields.push(data.subarray(at, at + length));
    at += length;
  }
  return fields;
}
