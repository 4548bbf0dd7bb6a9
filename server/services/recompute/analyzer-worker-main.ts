import { parentPort } from 'node:worker_threads';
import type { AnalyzeInput } from './analyzer';
import { engineAnalyzer } from './engine-analyzer';

/** One scope per message, answered with its outcomes or the error (analyzer-pool.ts). */
parentPort!.on('message', (task: { id: number; input: AnalyzeInput }) => {
  try {
    parentPort!.postMessage({ id: task.id, ok: true, outcomes: engineAnalyzer.analyze(task.input) });
  } catch (err) {
    const error = err instanceof Error ? { name: err.name, message: err.message, stack: err.stack } : { name: 'Error', message: String(err) };
    parentPort!.postMessage({ id: task.id, ok: false, error });
  }
});
parentPort!.postMessage({ ready: true });
