import cluster from 'node:cluster';
import type { Server } from 'node:http';
import type { Express } from 'express';

/** Listens on 127.0.0.1 (loopback only unless a proxy is put in front). Port 0 picks a free port. */
export function listen(app: Express, port: number, host = '127.0.0.1'): Promise<{ server: Server; port: number; close: () => Promise<void> }> {
  return new Promise((resolve, reject) => {
    const server = app.listen(port, host);
    server.once('error', reject);
    server.once('listening', () => {
      const address = server.address();
      const actual = typeof address === 'object' && address ? address.port : port;
      resolve({
        server,
        port: actual,
        close: () =>
          new Promise<void>((done) => {
            server.close(() => done());
            server.closeAllConnections();
          }),
      });
    });
  });
}

export interface ProcessPlan {
  /** Processes serving the port; 1 serves in this process. */
  count: number;
  /** Runs once, in the first process, before any server starts (migrations). */
  prepare: () => Promise<void>;
  /** Starts one server process's work (listen, background workers). */
  serve: () => Promise<void>;
  /** Told in the first process when every server process listens. */
  ready?: () => void;
  /** Told in the first process when a server process ends unasked (it is started again). */
  lost?: (exitCode: number | null) => void;
}

/** Pause before a server process that died is started again (ms): long enough not to spin on a broken start. */
const RESTART_DELAY_MS = 1_000;

/**
 * Serves in `count` processes sharing one port (node:cluster hands each new connection to one of
 * them), so the API uses every core: each request is answered by one process, and the processes
 * share nothing but the database (each keeps its own caches, see `server/http/reused-reads.ts`).
 * The first process only prepares and supervises: it restarts a process that dies, and stops them
 * all on SIGTERM or SIGINT. A server process whose supervisor is gone (killed) stops too.
 */
export async function serveInProcesses(plan: ProcessPlan): Promise<void> {
  if (cluster.isWorker) {
    process.once('disconnect', () => process.exit(1));
    await plan.serve();
    return;
  }
  await plan.prepare();
  if (plan.count <= 1) {
    await plan.serve();
    plan.ready?.();
    return;
  }
  let stopping = false;
  let listening = 0;
  const start = () => cluster.fork().once('listening', () => ++listening === plan.count && plan.ready?.());
  cluster.on('exit', (_worker, exitCode) => {
    if (stopping) return;
    plan.lost?.(exitCode);
    setTimeout(start, RESTART_DELAY_MS);
  });
  const stop = () => {
    stopping = true;
    const workers = Object.values(cluster.workers ?? {});
    if (workers.length === 0) process.exit(0);
    cluster.on('exit', () => Object.keys(cluster.workers ?? {}).length === 0 && process.exit(0));
    for (const worker of workers) worker?.process.kill('SIGTERM');
  };
  process.once('SIGINT', stop);
  process.once('SIGTERM', stop);
  for (let i = 0; i < plan.count; i++) start();
}
