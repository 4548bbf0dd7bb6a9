import { spawn, spawnSync } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';
import mysql from 'mysql2/promise';
import { ensureDebianPackages, findExecutable } from '../setup/debian-packages';

/**
 * A private MariaDB server for one checkout: data under `var/`, listening on 127.0.0.1 at a port
 * of our own (never 3306), started from Debian's `mariadbd` with `--no-defaults` so /etc/mysql is
 * never read. Root is reachable only through the private socket; the app uses its own user.
 */
export interface PrivateMariaDbOptions {
  /** Folder holding data/, the socket, pid and error log. */
  baseDir: string;
  port: number;
}

export interface AppDatabase {
  database: string;
  user: string;
  password: string;
  /** Extra database name patterns (SQL LIKE) the user may create and drop, e.g. test databases. */
  extraDatabasePattern?: string;
}

export class PrivateMariaDb {
  readonly dataDir: string;
  readonly socket: string;
  readonly pidFile: string;
  readonly errorLog: string;

  constructor(readonly options: PrivateMariaDbOptions) {
    this.dataDir = path.join(options.baseDir, 'data');
    this.socket = path.join(options.baseDir, 'mariadb.sock');
    this.pidFile = path.join(options.baseDir, 'mariadb.pid');
    this.errorLog = path.join(options.baseDir, 'mariadb.err');
  }

  /** Installs `mariadb-server` from Debian's packages when `mariadbd` is missing. */
  static ensureInstalled(): void {
    if (!findExecutable('mariadbd')) ensureDebianPackages(['mariadb-server'], 'the private MariaDB server');
  }

  /** Whether a server answers on our socket. */
  async isRunning(): Promise<boolean> {
    if (!fs.existsSync(this.socket)) return false;
    try {
      const conn = await mysql.createConnection({ socketPath: this.socket, user: 'root' });
      await conn.end();
      return true;
    } catch {
      return false;
    }
  }

  /**
   * Starts the server unless it already runs; initialises the data folder on first use.
   * @param detached keep running after this process exits (for `npm start`; tests stop it themselves)
   */
  async start({ detached }: { detached: boolean }): Promise<'started' | 'already-running'> {
    if (await this.isRunning()) return 'already-running';
    PrivateMariaDb.ensureInstalled();
    fs.mkdirSync(this.options.baseDir, { recursive: true });
    if (!fs.existsSync(path.join(this.dataDir, 'mysql'))) this.initialise();
    fs.rmSync(this.socket, { force: true });
    const mariadbd = findExecutable('mariadbd');
    if (!mariadbd) throw new Error('mariadbd is not installed.');
    const child = spawn(
      mariadbd,
      [
        '--no-defaults',
        `--datadir=${this.dataDir}`,
        `--socket=${this.socket}`,
        `--port=${this.options.port}`,
        '--bind-address=127.0.0.1',
        '--user=root',
        `--pid-file=${this.pidFile}`,
        `--log-error=${this.errorLog}`,
        '--local-infile=1',
        '--character-set-server=utf8mb4',
        '--collation-server=utf8mb4_unicode_ci',
        // Room for a month's staged and published observations (about 200 MB each per million
        // rows) without flushing midway: loading a million rows took about 20% less than at 512M/256M.
        '--innodb-buffer-pool-size=1G',
        '--innodb-log-file-size=1G',
        '--innodb-flush-log-at-trx-commit=2',
        '--max-allowed-packet=256M',
        '--skip-name-resolve',
      ],
      { detached, stdio: 'ignore' },
    );
    if (detached) child.unref();
    let exited: number | null = null;
    child.once('exit', (code) => (exited = code ?? -1));
    const deadline = Date.now() + 30_000;
    while (Date.now() < deadline) {
      if (exited !== null) break;
      if (await this.isRunning()) return 'started';
      await new Promise((r) => setTimeout(r, 100));
    }
    throw new Error(`MariaDB did not start on port ${this.options.port}. See ${this.errorLog}:\n${this.tailErrorLog()}`);
  }

  /** Creates the application database and user (idempotent) and returns nothing secret. */
  async ensureAppDatabase(app: AppDatabase): Promise<void> {
    const conn = await mysql.createConnection({ socketPath: this.socket, user: 'root', multipleStatements: false });
    try {
      await conn.query(`CREATE DATABASE IF NOT EXISTS \`${app.database}\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci`);
      // TCP connections to 127.0.0.1 may match either host entry, so create both.
      for (const host of ['localhost', '127.0.0.1']) {
        await conn.query('CREATE USER IF NOT EXISTS ?@? IDENTIFIED BY ?', [app.user, host, app.password]);
        await conn.query('ALTER USER ?@? IDENTIFIED BY ?', [app.user, host, app.password]);
        await conn.query(`GRANT ALL PRIVILEGES ON \`${app.database}\`.* TO ?@?`, [app.user, host]);
        if (app.extraDatabasePattern) {
          await conn.query(`GRANT ALL PRIVILEGES ON \`${app.extraDatabasePattern}\`.* TO ?@?`, [app.user, host]);
        }
      }
      await conn.query('FLUSH PRIVILEGES');
    } finally {
      await conn.end();
    }
  }

  /** Stops the server if it runs; waits for it to exit. */
  async stop(): Promise<'stopped' | 'not-running'> {
    if (!(await this.isRunning())) return 'not-running';
    const admin = findExecutable('mariadb-admin') ?? findExecutable('mysqladmin');
    if (admin) spawnSync(admin, ['--no-defaults', `--socket=${this.socket}`, '-uroot', 'shutdown'], { stdio: 'ignore' });
    else {
      const pid = Number(fs.readFileSync(this.pidFile, 'utf8').trim());
      if (pid > 0) process.kill(pid, 'SIGTERM');
    }
    const deadline = Date.now() + 30_000;
    while (Date.now() < deadline && fs.existsSync(this.pidFile)) await new Promise((r) => setTimeout(r, 100));
    return 'stopped';
  }

  /** Stops the server and deletes its data folder. */
  async destroy(): Promise<void> {
    await this.stop();
    fs.rmSync(this.options.baseDir, { recursive: true, force: true });
  }

  private initialise(): void {
    const installDb = findExecutable('mariadb-install-db') ?? findExecutable('mysql_install_db');
    if (!installDb) throw new Error('mariadb-install-db is not installed.');
    fs.mkdirSync(this.dataDir, { recursive: true });
    const result = spawnSync(
      installDb,
      ['--no-defaults', `--datadir=${this.dataDir}`, '--auth-root-authentication-method=normal', '--user=root', '--skip-test-db'],
      { encoding: 'utf8' },
    );
    if (result.status !== 0) throw new Error(`Could not initialise MariaDB data in ${this.dataDir}:\n${result.stderr}`);
  }

  private tailErrorLog(): string {
    try {
      return fs.readFileSync(this.errorLog, 'utf8').split('\n').slice(-15).join('\n');
    } catch {
      return '(no error log)';
    }
  }
}
