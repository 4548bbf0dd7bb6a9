import fs from 'node:fs';
import path from 'node:path';
import { Readable } from 'node:stream';
import type { PoolConnection, Query, QueryOptions } from 'mysql2';
import type { DataSource, QueryRunner } from 'typeorm';

/**
 * A pooled mysql2 connection of the TypeORM data source, for the two things TypeORM cannot do:
 * `LOAD DATA LOCAL INFILE` with a per-statement stream factory, and streaming rows as arrays.
 * Always `release()` it.
 */
export async function rawConnection(ds: DataSource): Promise<{ conn: PoolConnection; runner: QueryRunner; release: () => Promise<void> }> {
  const runner = ds.createQueryRunner();
  const conn = (await runner.connect()) as PoolConnection;
  return { conn, runner, release: () => runner.release() };
}

export function rawQuery<T = unknown>(conn: PoolConnection, options: QueryOptions): Promise<T> {
  return new Promise((resolve, reject) => {
    conn.query(options, (err, result) => (err ? reject(err) : resolve(result as T)));
  });
}

/**
 * Runs `LOAD DATA LOCAL INFILE` for exactly one file. The stream factory is given to this one
 * statement (none is configured on the pool, so no other statement can make the server read a local
 * file), and it opens only `file`, which must lie inside `allowedDir`: a server that asked for any
 * other path gets an error instead of the file.
 * @param sql a statement whose file name is `?` (filled with `file`)
 * @returns rows the server reports as loaded
 */
export async function loadDataLocalInfile(conn: PoolConnection, sql: string, file: string, allowedDir: string): Promise<number> {
  const wanted = fs.realpathSync(file);
  const root = fs.realpathSync(allowedDir);
  if (!wanted.startsWith(root + path.sep)) throw new Error('LOAD DATA refused: the file is outside the ingest folder.');
  const result = await rawQuery<{ affectedRows: number }>(conn, {
    sql,
    values: [wanted],
    infileStreamFactory: (requested: string) =>
      requested === wanted
        ? fs.createReadStream(wanted, { highWaterMark: 1024 * 1024 })
        : new Readable({
            read() {
              this.destroy(new Error('LOAD DATA refused: the server asked for another file.'));
            },
          }),
  });
  return result.affectedRows;
}

/** Streams a query's rows as arrays, one callback a row, without holding the result in memory. */
export function streamRows(conn: PoolConnection, sql: string, values: unknown[], onRow: (row: unknown[]) => void): Promise<void> {
  return new Promise((resolve, reject) => {
    const query: Query = conn.query({ sql, values, rowsAsArray: true });
    query.on('result', (row) => onRow(row as unknown as unknown[]));
    query.on('error', reject);
    query.on('end', () => resolve());
  });
}
