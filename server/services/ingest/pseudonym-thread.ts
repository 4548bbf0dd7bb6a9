import { Worker } from 'node:worker_threads';

const WORKER_ENTRY = new URL('./pseudonym-worker.mjs', import.meta.url);

/** What the worker is asked: the pseudonyms of `values` under `secret` (`pseudonym()` in `pseudonym.ts`). */
export interface PseudonymRequest {
  id: number;
  secret: string;
  purpose: 'subject' | 'cluster';
  programId: number;
  values: string[];
}

interface Waiting {
  resolve: (hashes: Buffer) => void;
  reject: (err: Error) => void;
}

let worker: Worker | null = null;
const waiting = new Map<number, Waiting>();
let nextId = 1;

/**
 * Keyed pseudonyms of a batch of values, computed on a worker thread: exactly `pseudonym()` for
 * each value, in order, as one buffer of 32-byte digests. The HMAC of one identifier costs more
 * than all the other checks of its row, so the validation pass asks for one batch's pseudonyms and
 * checks the next batch meanwhile, on the other core. One worker per process, started on first use
 * and started again after it died; it does not keep the process alive when idle. The secret goes
 * to the worker in memory only.
 */
export function pseudonymsOnThread(secret: string, purpose: PseudonymRequest['purpose'], programId: number, values: string[]): Promise<Buffer> {
  const thread = worker ?? start();
  const id = nextId++;
  return new Promise<Buffer>((resolve, reject) => {
    waiting.set(id, { resolve, reject });
    thread.ref();
    thread.postMessage({ id, secret, purpose, programId, values } satisfies PseudonymRequest);
  });
}

function start(): Worker {
  const thread = new Worker(WORKER_ENTRY, { execArgv: [] });
  worker = thread;
  thread.unref();
  thread.on('message', (message: { id: number; ok: boolean; bytes?: ArrayBuffer; message?: string }) => {
    const task = waiting.get(message.id);
    if (!task) return;
    waiting.delete(message.id);
    if (waiting.size === 0) thread.unref();
    if (message.ok) task.resolve(Buffer.from(message.bytes!));
    else task.reject(workerError('pseudonym_batch_failed', message.message ?? 'A batch of pseudonyms failed.'));
  });
  const lost = (err: Error) => {
    if (worker !== thread) return;
    worker = null;
    for (const task of waiting.values()) task.reject(err);
    waiting.clear();
  };
  thread.on('error', (err) => lost(workerError('pseudonym_worker_failed', `The pseudonym worker failed: ${err.message}`)));
  thread.on('exit', (code) => lost(workerError('pseudonym_worker_stopped', `The pseudonym worker stopped (exit code ${code}).`)));
  return thread;
}

/** An error with a code, since the ingest worker logs only names and codes of what failed (`safeError`). */
function workerError(code: string, message: string): Error {
  return Object.assign(new Error(message), { code });
}
