import type { KeyObject } from 'node:crypto';
import { parentPort } from 'node:worker_threads';
import { pseudonym, pseudonymKey } from './pseudonym';
import type { PseudonymRequest } from './pseudonym-thread';

/** The prepared key of the last secret seen (one per process in practice). */
let prepared: { secret: string; key: KeyObject } | null = null;

/** One batch per message, answered with its pseudonyms end to end (32 bytes each) or the error. */
parentPort!.on('message', (task: PseudonymRequest) => {
  try {
    if (prepared?.secret !== task.secret) prepared = { secret: task.secret, key: pseudonymKey(task.secret) };
    const out = Buffer.allocUnsafe(32 * task.values.length);
    for (let i = 0; i < task.values.length; i++) pseudonym(prepared.key, task.purpose, task.programId, task.values[i]!).copy(out, 32 * i);
    const bytes = out.buffer.slice(out.byteOffset, out.byteOffset + out.length);
    parentPort!.postMessage({ id: task.id, ok: true, bytes }, [bytes]);
  } catch (err) {
    parentPort!.postMessage({ id: task.id, ok: false, message: err instanceof Error ? err.message : String(err) });
  }
});
