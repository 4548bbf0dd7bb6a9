import type { DataSource } from 'typeorm';

/**
 * The dashboards' read endpoints answer many identical requests between recomputes. This keeps
 * each answer, serialised, per program and request, and serves it while the program's *results
 * stamp* is unchanged. The stamp is one indexed query over everything those answers depend on:
 * the program row (its `updated_at` moves with any change to its definitions or cutoff schedule),
 * the primary design and its version, the results (count, newest id and time, stale count), the
 * acknowledgements, the deviations and the latest run with its progress. Any write anywhere, by
 * any process, changes the stamp, so no process needs to be told; a stale entry is never served.
 */
const MAX_ENTRIES = 500;
const entries = new Map<string, { stamp: string; body: string }>();

export async function resultsStamp(ds: DataSource, programId: number): Promise<string> {
  const [row] = (await ds.query(
    `SELECT
       (SELECT CONCAT_WS('|', id, updated_at) FROM program WHERE id = ?) AS program,
       (SELECT CONCAT_WS('|', id, current_version, updated_at) FROM evaluation_design WHERE primary_of_program_id = ?) AS design,
       (SELECT CONCAT_WS('|', COUNT(*), MAX(id), MAX(computed_at), SUM(stale)) FROM estimate_result WHERE program_id = ?) AS results,
       (SELECT CONCAT_WS('|', COUNT(*), MAX(id)) FROM caveat_acknowledgement WHERE program_id = ?) AS acks,
       (SELECT CONCAT_WS('|', COUNT(*), MAX(d.id)) FROM design_deviation d JOIN evaluation_design e ON e.id = d.design_id WHERE e.program_id = ?) AS deviations,
       (SELECT CONCAT_WS('|', id, status, attempts, progress_done, progress_total, finished_at) FROM recompute_run WHERE program_id = ? ORDER BY id DESC LIMIT 1) AS run`,
    [programId, programId, programId, programId, programId, programId],
  )) as Array<Record<string, string | null>>;
  return JSON.stringify(row ?? {});
}

/**
 * The JSON text of `compute()` for `key`, from the cache while the program's stamp holds.
 * Errors are not cached.
 */
export async function cachedResultsJson(ds: DataSource, programId: number, key: string, compute: () => Promise<unknown>): Promise<string> {
  const stamp = await resultsStamp(ds, programId);
  const cacheKey = `${ds.options.database ?? ''}:${programId}:${key}`;
  const hit = entries.get(cacheKey);
  if (hit && hit.stamp === stamp) return hit.body;
  const body = JSON.stringify(await compute());
  if (entries.size >= MAX_ENTRIES) entries.delete(entries.keys().next().value!);
  entries.set(cacheKey, { stamp, body });
  return body;
}
