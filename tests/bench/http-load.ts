import { spawn } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { REPO_ROOT } from '@server/config/env';
import { ensureDebianPackages } from '@server/setup/debian-packages';
import { waitedChildrenCpuSeconds } from './process-cpu';

export interface LoadRequest {
  path: string;
  /** The `Cookie` header: whose session the request reads as. */
  cookie: string;
}

export interface LoadResult {
  /** Answers received in the measured seconds. */
  total: number;
  /** Answers with an error status (4xx, 5xx: wrk counts those), plus connection errors and timeouts. */
  notOk: number;
  /** Latency percentiles (ms, request written to answer read), over every answer. */
  p50Ms: number;
  p95Ms: number;
  p99Ms: number;
  /** CPU seconds the load generator itself spent (it shares the machine with the app). */
  generatorCpuS: number;
}

const LUA_SCRIPT = path.join(REPO_ROOT, 'tests', 'bench', 'http-load.lua');

/**
 * Closed-loop HTTP load from wrk (Debian's package, installed here if missing): `connections`
 * keep-alive connections on two threads, each sending the next of `requests` (cycled) as soon as the
 * previous answer has fully arrived, for `seconds`. wrk rather than a Node client because the load
 * generator runs on the same two cores as the app: undici's client cost 0.14–0.16 ms of CPU per
 * request and autocannon's more, both taken from the app under test; wrk costs a fraction of that.
 */
export async function runHttpLoad(url: string, requests: readonly LoadRequest[], options: { connections: number; seconds: number }): Promise<LoadResult> {
  ensureDebianPackages(['wrk'], 'the API benchmark');
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'cutline-load-'));
  const list = path.join(dir, 'requests.tsv');
  fs.writeFileSync(list, requests.map((r) => `${r.path}\t${r.cookie}\n`).join(''), { mode: 0o600 });
  const cpuBefore = waitedChildrenCpuSeconds();
  try {
    const args = ['-t2', `-c${options.connections}`, `-d${options.seconds}s`, '--timeout', '10s', '-s', LUA_SCRIPT, url, '--', list];
    const { code, stdout, stderr } = await new Promise<{ code: number | null; stdout: string; stderr: string }>((resolve, reject) => {
      const child = spawn('wrk', args, { stdio: ['ignore', 'pipe', 'pipe'] });
      let out = '';
      let err = '';
      child.stdout.on('data', (b: Buffer) => (out += b.toString()));
      child.stderr.on('data', (b: Buffer) => (err += b.toString()));
      child.once('error', reject);
      child.once('close', (c) => resolve({ code: c, stdout: out, stderr: err }));
    });
    const line = /^wrk-result (.*)$/m.exec(stdout)?.[1];
    if (code !== 0 || !line) throw new Error(`wrk ended with code ${code} and no result line:\n${stdout}\n${stderr}`.trim());
    const figures = Object.fromEntries(line.split(' ').map((kv) => kv.split('=') as [string, string]).map(([k, v]) => [k, Number(v)]));
    const durationS = figures.duration_us! / 1e6;
    if (Math.abs(durationS - options.seconds) > 1) throw new Error(`wrk ran ${durationS.toFixed(1)} s instead of ${options.seconds} s.`);
    return {
      total: figures.requests!,
      notOk: figures.not_ok! + figures.errors!,
      p50Ms: figures.p50_us! / 1000,
      p95Ms: figures.p95_us! / 1000,
      p99Ms: figures.p99_us! / 1000,
      generatorCpuS: waitedChildrenCpuSeconds() - cpuBefore,
    };
  } finally {
    fs.rmSync(dir, { recursive: true, force: true });
  }
}
