/**
 * Lets code that queues a recompute (routes, ingest) nudge this process's worker without
 * depending on how it is built. `npm start` and the tests register the worker's `wake`; without
 * one, the every-minute job picks the run up.
 */
const wakers = new WeakMap<object, () => void>();

export function setRecomputeWaker(dataSource: object, wake: (() => void) | null): void {
  if (wake) wakers.set(dataSource, wake);
  else wakers.delete(dataSource);
}

/** Call after the transaction that queued a run has committed. */
export function wakeRecompute(dataSource: object): void {
  wakers.get(dataSource)?.();
}
