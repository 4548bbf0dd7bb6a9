import type { RequestHandler } from 'express';
import { ExpiringMap } from '../lib/expiring-map';
import { SAFE_METHODS } from '../auth/csrf';

/**
 * How long one process reuses what it read for a request's checks: the session, the person with
 * their grants, a program's results stamp (ms). Reading them costs three database round trips, the
 * larger part of a cached dashboard answer; within this window repeated requests skip them.
 * Changes made through this process are seen at once (`forgetReusedReads` after every
 * state-changing request, sessions forgotten when saved or destroyed); changes made by another
 * process — another app instance, the jobs process, an administrator's SQL — within this window.
 * One second: shorter than any person can act on a page (common practice, no source).
 */
export const REUSE_READS_MS = 1_000;

/** Share of `REUSE_READS_MS` by which each reused read's life is randomly shortened (`ExpiringMap`). */
export const REUSE_READS_SPREAD = 0.5;

/** Readers that reuse reads register here to forget them after a local change. */
const forgetters = new Set<() => void>();

/** A map of reads that every local change empties (`maxEntries` keeps a busy process bounded). */
export function reusedReads<K, V>(maxEntries: number): ExpiringMap<K, V> {
  const map = new ExpiringMap<K, V>(REUSE_READS_MS, maxEntries, REUSE_READS_SPREAD);
  forgetters.add(() => map.clear());
  return map;
}

/** Forgets every reused read of this process (grants, accounts and results may have changed). */
export function forgetReusedReads(): void {
  for (const forget of forgetters) forget();
}

/** Forgets reused reads when a state-changing request ends, whatever it changed and however it ended. */
export const forgetReadsAfterChanges: RequestHandler = (req, res, next) => {
  if (!SAFE_METHODS.has(req.method)) res.once('close', forgetReusedReads);
  next();
};
