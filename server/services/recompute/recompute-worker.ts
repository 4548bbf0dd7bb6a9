import type { RecomputeDeps } from './recompute-deps';
import { nextQueuedAt } from './run-queue';
import { processRecomputeQueue, type RunReport } from './run-recompute';

/**
 * Runs queued recomputes in this process soon after they are queued (`wake()`), and again when a
 * retry's back-off ends. The durable queue is the `recompute_run` table: the every-minute job and
 * other instances work through it too, and the named lock keeps them from overlapping.
 */
export class RecomputeWorker {
  private running: Promise<void> | null = null;
  private again = false;
  private timer: NodeJS.Timeout | null = null;
  private stopped = false;

  constructor(private readonly deps: RecomputeDeps) {}

  /** Work through the queue now (coalesces: a wake while working runs one more pass after). */
  wake(): void {
    if (this.stopped) return;
    if (this.running) {
      this.again = true;
      return;
    }
    this.running = this.loop().finally(() => (this.running = null));
  }

  /** Resolves when no pass is running (tests wait on it). */
  async idle(): Promise<void> {
    while (this.running) await this.running;
  }

  async stop(): Promise<void> {
    this.stopped = true;
    if (this.timer) clearTimeout(this.timer);
    await this.idle();
  }

  private async loop(): Promise<void> {
    do {
      this.again = false;
      const reports: RunReport[] = await processRecomputeQueue(this.deps).catch((err: unknown) => {
        this.deps.logger.error({ err }, 'recompute queue pass failed');
        return [];
      });
      if (reports.some((r) => r.outcome === 'retrying')) await this.armTimer();
    } while (this.again && !this.stopped);
  }

  /** Wakes again when the earliest back-off ends (capped at an hour; the minute job covers the rest). */
  private async armTimer(): Promise<void> {
    const at = await nextQueuedAt(this.deps.dataSource).catch(() => null);
    if (!at || this.stopped) return;
    if (this.timer) clearTimeout(this.timer);
    const delay = Math.min(60 * 60_000, Math.max(0, at.getTime() - this.deps.now().getTime()) + 50);
    this.timer = setTimeout(() => this.wake(), delay);
    this.timer.unref();
  }
}

const workers = new WeakMap<object, RecomputeWorker>();

/** The worker of a data source (one per process and database). */
export function recomputeWorker(deps: RecomputeDeps): RecomputeWorker {
  let worker = workers.get(deps.dataSource);
  if (!worker) {
    worker = new RecomputeWorker(deps);
    workers.set(deps.dataSource, worker);
  }
  return worker;
}
