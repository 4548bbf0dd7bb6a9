import { createHash } from 'node:crypto';
import { promisify } from 'node:util';
import zlib from 'node:zlib';
import type { Request, Response } from 'express';
import type { DataSource } from 'typeorm';
import { reusedReads } from '../http/reused-reads';

/**
 * The dashboards' read endpoints answer many identical requests between recomputes. This keeps
 * each answer, serialised, per program and request, and serves it while the program's *results
 * stamp* is unchanged. The stamp is one indexed query over everything those answers depend on:
 * the program row (its `updated_at` moves with any change to its definitions or cutoff schedule),
 * the primary design and its version, the results (count, newest id and time, stale count), the
 * acknowledgements, the deviations and the latest run with its progress. Any write anywhere, by
 * any process, changes the stamp, so no process needs to be told. The stamp itself is reused for
 * `REUSE_READS_MS`: a change made through this process shows at once, one made elsewhere (a
 * recompute in the jobs process) within that second.
 */
const MAX_ENTRIES = 500;
const gzip = promisify(zlib.gzip);
const entries = new Map<string, { stamp: string; answer: CachedJson }>();
/** Answers being computed, by key and stamp: requests that miss together share one computation. */
const computing = new Map<string, Promise<CachedJson>>();
/** Each program's stamp, reused for a moment (`server/http/reused-reads.ts`). */
const stamps = reusedReads<string, string>(MAX_ENTRIES);

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

/** A cached answer: the JSON bytes, the same gzip-compressed, and their entity tag. */
export interface CachedJson {
  body: Buffer;
  gzipped: Buffer;
  etag: string;
}

/**
 * The JSON of `compute()` for `key`, from the cache while the program's stamp holds, with a weak
 * entity tag made once per entry (hashing the body on every answer cost more than the lookup).
 * Requests that miss together (every dashboard after a recompute) share one computation and one
 * stamp read. Errors are not cached.
 */
export async function cachedResultsJson(ds: DataSource, programId: number, key: string, compute: () => Promise<unknown>): Promise<CachedJson> {
  const programKey = `${ds.options.database ?? ''}:${programId}`;
  const kept = stamps.load(programKey, () => resultsStamp(ds, programId));
  const stamp = kept instanceof Promise ? (await kept)! : kept;
  const cacheKey = `${programKey}:${key}`;
  const hit = entries.get(cacheKey);
  if (hit && hit.stamp === stamp) return hit.answer;
  const computeKey = `${cacheKey}\n${stamp}`;
  let answer = computing.get(computeKey);
  if (!answer) {
    answer = serialise(compute).finally(() => computing.delete(computeKey));
    computing.set(computeKey, answer);
    const done = await answer;
    if (entries.size >= MAX_ENTRIES) entries.delete(entries.keys().next().value!);
    entries.set(cacheKey, { stamp, answer: done });
  }
  return answer;
}

async function serialise(compute: () => Promise<unknown>): Promise<CachedJson> {
  const body = Buffer.from(JSON.stringify(await compute()));
  return { body, gzipped: await gzip(body), etag: `W/"${createHash('sha1').update(body).digest('base64url')}"` };
}

/**
 * Sends a cached answer — compressed once when it was cached, for the browsers that accept gzip
 * (all do; dashboard answers shrink to a quarter or less) — or 304 when the browser already holds it.
 */
export function sendCachedJson(req: Request, res: Response, answer: CachedJson): void {
  res.setHeader('ETag', answer.etag);
  res.setHeader('Content-Type', 'application/json; charset=utf-8');
  res.vary('Accept-Encoding');
  if (req.fresh) {
    res.status(304).end();
    return;
  }
  // The bytes as they are: `res.send` would look up the type, test freshness again and copy nothing more.
  const gzipped = req.acceptsEncodings('gzip', 'identity') === 'gzip';
  const body = gzipped ? answer.gzipped : answer.body;
  if (gzipped) res.setHeader('Content-Encoding', 'gzip');
  res.setHeader('Content-Length', body.length);
  res.end(body);
}
