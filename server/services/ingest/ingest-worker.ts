import type { DataSource } from 'typeorm';
import { In } from 'typeorm';
import { Extract } from '../../entities/extract.entity';
import { AppError } from '../../lib/errors';
import { tryNamedLock } from '../recompute/named-lock';
import { loadExtract, stageTable } from './load-extract';
import { validateExtract, type IngestDeps } from './validate-extract';

/** Attempts before an extract that keeps breaking the work is set aside as failed. */
const MAX_ATTEMPTS = 3;

/**
 * Background work on extracts, in the server process: one extract at a time (the machine is small
 * and `LOAD DATA` saturates a core), in the order queued. Each step runs under a MariaDB named
 * lock, so several app instances never work on the same extract. The state lives in the database:
 * after a crash, `recover()` queues whatever was `validating` or `loading` again, and each step
 * starts over cleanly (validation rewrites its report, loading drops its staging table).
 */
export class IngestWorker {
  private readonly queue: number[] = [];
  private running: Promise<void> | null = null;
  private stopped = false;

  constructor(private readonly deps: IngestDeps) {}

  /** Queues an extract whose status says what to do (`validating` or `loading`). */
  enqueue(extractId: number): void {
    if (this.stopped || this.queue.includes(extractId)) return;
    this.queue.push(extractId);
    if (!this.running) this.running = this.drain().finally(() => (this.running = null));
  }

  /** Resolves when the queue is empty (tests and the demo installer wait on it). */
  async idle(): Promise<void> {
    while (this.running) await this.running;
  }

  /**
   * Stops taking work. A step still running is cut off when the database closes and left in its
   * status, so the next start resumes it (it is not marked failed).
   */
  async stop(): Promise<void> {
    this.stopped = true;
    this.queue.length = 0;
  }

  /**
   * Queues interrupted work again and drops staging tables nobody is loading. Call once at start-up.
   * @returns how many extracts were queued
   */
  async recover(): Promise<number> {
    const ds = this.deps.dataSource;
    const pending = await ds.getRepository(Extract).find({ where: { status: In(['validating', 'loading']) }, order: { id: 'ASC' } });
    const tables: Array<{ name: string }> = await ds.query(
      "SELECT table_name AS name FROM information_schema.tables WHERE table_schema = DATABASE() AND table_name LIKE 'observation\\_stage\\_%'",
    );
    const loading = new Set(pending.filter((e) => e.status === 'loading').map((e) => stageTable(e.id)));
    for (const { name } of tables) if (!loading.has(name) && /^observation_stage_\d+$/.test(name)) await ds.query(`DROP TABLE IF EXISTS \`${name}\``);
    for (const e of pending) this.enqueue(e.id);
    if (pending.length > 0) this.deps.logger.info({ extracts: pending.map((e) => e.id) }, 'resuming interrupted extract work');
    return pending.length;
  }

  private async drain(): Promise<void> {
    while (this.queue.length > 0 && !this.stopped) {
      const id = this.queue.shift()!;
      await this.step(id).catch((err: unknown) => {
        if (!this.stopped) this.deps.logger.error({ extractId: id, err: safeError(err) }, 'extract work failed');
      });
    }
  }

  private async step(extractId: number): Promise<void> {
    const ds = this.deps.dataSource;
    const lock = await tryNamedLock(ds, extractLockName(ds, extractId));
    if (!lock) return; // another instance is on it
    try {
      const repo = ds.getRepository(Extract);
      const extract = await repo.findOneBy({ id: extractId });
      if (!extract || (extract.status !== 'validating' && extract.status !== 'loading')) return;
      if (extract.attempts >= MAX_ATTEMPTS) {
        await this.fail(extract, new AppError('extract_processing_failed', `Cutline stopped ${MAX_ATTEMPTS} times while working on this extract. Nothing from it is visible. Try again, or upload the file again.`));
        return;
      }
      await repo.increment({ id: extractId }, 'attempts', 1);
      try {
        if (extract.status === 'validating') await validateExtract(this.deps, extractId);
        else await loadExtract(this.deps, extractId);
      } catch (err) {
        if (!this.stopped) await this.fail(extract, err);
        throw err;
      }
    } finally {
      await lock.release().catch(() => undefined);
    }
  }

  /** Marks the step as failed, keeping everything needed for a retry. Nothing becomes visible. */
  private async fail(extract: Extract, err: unknown): Promise<void> {
    const ds = this.deps.dataSource;
    const message =
      err instanceof AppError ? err.message : 'Something went wrong while working on this extract. Nothing from it is visible; the error has been logged. Try again.';
    await ds.query(`DROP TABLE IF EXISTS \`${stageTable(extract.id)}\``).catch(() => undefined);
    await ds
      .getRepository(Extract)
      .update({ id: extract.id, status: extract.status }, { status: 'failed', problemCode: err instanceof AppError ? err.code : 'extract_processing_failed', problemMessage: message, progress: null })
      .catch(() => undefined);
  }
}

/** Error details for the log: names and codes only (database errors can quote values). */
function safeError(err: unknown): Record<string, unknown> {
  if (err instanceof AppError) return { code: err.code };
  if (err instanceof Error) return { name: err.name, code: (err as { code?: unknown }).code ?? null };
  return { value: typeof err };
}

/** Named locks are server-wide in MariaDB: the name carries the database, so two databases never block each other. */
function extractLockName(ds: DataSource, extractId: number): string {
  return `cutline:${String(ds.options.database ?? 'cutline')}:extract:${extractId}`.slice(0, 64);
}

const workers = new WeakMap<DataSource, Map<string, IngestWorker>>();

/**
 * The worker of a data source and runtime folder (one per process and database in practice; a
 * caller with another folder, such as a test's demo installer, gets its own, since the folder holds
 * the files the work needs).
 */
export function ingestWorker(deps: IngestDeps): IngestWorker {
  let byFolder = workers.get(deps.dataSource);
  if (!byFolder) workers.set(deps.dataSource, (byFolder = new Map()));
  let worker = byFolder.get(deps.config.varDir);
  if (!worker) byFolder.set(deps.config.varDir, (worker = new IngestWorker(deps)));
  return worker;
}
