import { createHash } from 'node:crypto';
import { spawnSync } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';
import { REPO_ROOT } from '../config/env';

const SOURCES = ['client', 'shared', 'fonts'];
const EXTRA_FILES = ['package-lock.json', 'tsconfig.base.json'];
const STAMP = path.join(REPO_ROOT, 'dist', 'client', '.source-hash');

/** Hash of every client input (paths and contents), so a rebuild happens only when something changed. */
function sourceHash(): string {
  const hash = createHash('sha256');
  const visit = (dir: string) => {
    for (const entry of fs.readdirSync(dir, { withFileTypes: true }).sort((a, b) => a.name.localeCompare(b.name))) {
      const full = path.join(dir, entry.name);
      if (entry.isDirectory()) {
        if (entry.name !== 'node_modules') visit(full);
      } else if (!/\.test\.tsx?$/.test(entry.name)) {
        hash.update(path.relative(REPO_ROOT, full));
        hash.update(fs.readFileSync(full));
      }
    }
  };
  for (const dir of SOURCES) visit(path.join(REPO_ROOT, dir));
  for (const file of EXTRA_FILES) hash.update(fs.readFileSync(path.join(REPO_ROOT, file)));
  return hash.digest('hex');
}

/** Builds the client with Vite unless the last build came from the same sources. */
export function ensureClientBuilt(log: (line: string) => void): void {
  const want = sourceHash();
  if (fs.existsSync(STAMP) && fs.readFileSync(STAMP, 'utf8') === want) return;
  log('Building the web client…');
  const vite = path.join(REPO_ROOT, 'node_modules', '.bin', 'vite');
  const result = spawnSync(vite, ['build', '--config', 'client/vite.config.ts', '--logLevel', 'warn'], { cwd: REPO_ROOT, stdio: 'inherit' });
  if (result.status !== 0) throw new Error('The client build failed (see the messages above).');
  fs.writeFileSync(STAMP, want);
}
