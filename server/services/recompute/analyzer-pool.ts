import os from 'node:os';
import { Worker } from 'node:worker_threads';
import type { AnalyzedOutcome, AnalyzeInput, Analyzer } from './analyzer';
import { engineAnalyzer } from './engine-analyzer';

const WORKER_ENTRY = new URL('./analyzer-worker.mjs', import.meta.url);

/** Workers a pool starts by default: one per core the process may use, at most 4. */
export function defaultPoolSize(): number {
  return Math.max(1, Math.min(4, os.availableParallelism()));
}

interface Task {
  id: number;
  input: AnalyzeInput;
  resolve: (outcomes: AnalyzedOutcome[]) => void;
  reject: (err: Error) => void;
}

interface Slot {
  worker: Worker;
  busy: Task | null;
}

/**
 * The engine analyzer on worker threads: scopes are independent and CPU-bound, so a recompute
 * analyses as many at once as there are workers (`parallelism`) and uses every core. Same results
 * as `engineAnalyzer` (each worker runs it on a copy of the scope's arrays). Workers start on first
 * use, do not keep the process alive when idle, and one that dies is replaced; its scope fails
 * like any analysis error (the run is retried).
 */
export function pooledEngineAnalyzer(size = defaultPoolSize()): Analyzer {
  const slots: Slot[] = [];
  const queue: Task[] = [];
  let nextId = 1;

  const start = (): Slot => {
    const slot: Slot = { worker: new Worker(WORKER_ENTRY, { execArgv: [] }), busy: null };
    slot.worker.unref();
    slot.worker.on('message', (message: { id?: number; ok?: boolean; outcomes?: AnalyzedOutcome[]; error?: { name: string; message: string; stack?: string } }) => {
      const task = slot.busy;
      if (!task || message.id !== task.id) return;
      slot.busy = null;
      slot.worker.unref();
      if (message.ok) task.resolve(message.outcomes!);
      else task.reject(Object.assign(new Error(message.error!.message), { name: message.error!.name, stack: message.error!.stack }));
      dispatch();
    });
    const lost = (err: Error) => {
      const task = slot.busy;
      slots.splice(slots.indexOf(slot), 1);
      if (task) task.reject(err);
      dispatch();
    };
    slot.worker.on('error', lost);
    slot.worker.on('exit', (code) => {
      if (slots.includes(slot)) lost(new Error(`An analysis worker stopped (exit code ${code}).`));
    });
    slots.push(slot);
    return slot;
  };

  const dispatch = () => {
    while (queue.length > 0) {
      const slot = slots.find((s) => !s.busy) ?? (slots.length < size ? start() : null);
      if (!slot) return;
      const task = queue.shift()!;
      slot.busy = task;
      slot.worker.ref();
      slot.worker.postMessage({ id: task.id, input: task.input });
    }
  };

  return {
    engineVersion: engineAnalyzer.engineVersion,
    diagnosticsVersion: engineAnalyzer.diagnosticsVersion,
    parallelism: size,
    analyze: (input) =>
      new Promise<AnalyzedOutcome[]>((resolve, reject) => {
        queue.push({ id: nextId++, input, resolve, reject });
        dispatch();
      }),
  };
}
