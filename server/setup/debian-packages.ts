import { spawnSync } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';

const SEARCH_PATH = ['/usr/sbin', '/usr/bin', '/sbin', '/bin', '/usr/local/bin', '/usr/local/sbin'];

/** Full path of an executable on PATH or in the usual system folders, or null. */
export function findExecutable(name: string): string | null {
  const dirs = [...(process.env.PATH ?? '').split(':'), ...SEARCH_PATH];
  for (const dir of dirs) {
    if (!dir) continue;
    const candidate = path.join(dir, name);
    try {
      fs.accessSync(candidate, fs.constants.X_OK);
      return candidate;
    } catch {
      // keep looking
    }
  }
  return null;
}

/** Whether every Debian package is installed (dpkg status "install ok installed"). */
export function debianPackagesInstalled(packages: readonly string[]): boolean {
  const result = spawnSync('dpkg-query', ['-W', '-f=${Status}\\n', ...packages], { encoding: 'utf8' });
  if (result.status !== 0) return false;
  const lines = result.stdout.trim().split('\n');
  return lines.length === packages.length && lines.every((l) => l === 'install ok installed');
}

/**
 * Installs Debian packages with apt-get (no recommends), refreshing the package lists once if the
 * first attempt fails. Prints what it does because it takes tens of seconds.
 * @throws Error with apt's last lines when installation is impossible.
 */
export function ensureDebianPackages(packages: readonly string[], purpose: string, { recommends = false } = {}): void {
  if (debianPackagesInstalled(packages)) return;
  console.log(`Installing ${packages.join(', ')} from Debian's packages for ${purpose}…`);
  const env = { ...process.env, DEBIAN_FRONTEND: 'noninteractive' };
  const install = () =>
    spawnSync('apt-get', ['install', '-y', ...(recommends ? [] : ['--no-install-recommends']), ...packages], { env, encoding: 'utf8' });
  let result = install();
  if (result.status !== 0) {
    spawnSync('apt-get', ['update'], { env, stdio: 'ignore' });
    result = install();
  }
  if (result.status !== 0) {
    const tail = `${result.stdout}\n${result.stderr}`.trim().split('\n').slice(-10).join('\n');
    throw new Error(`Could not install ${packages.join(', ')} (${purpose}). apt-get said:\n${tail}`);
  }
}
