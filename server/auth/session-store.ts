import type { DataSource } from 'typeorm';
import { REUSE_READS_MS, REUSE_READS_SPREAD } from '../http/reused-reads';
import { ExpiringMap } from '../lib/expiring-map';

/**
 * How often one process writes a session's renewed idle expiry (ms). Writing it on every request
 * would cost the database an UPDATE per request; at most once a minute per session moves the idle
 * timeout by at most a minute.
 */
export const TOUCH_INTERVAL_MS = 60_000;

/** Sessions whose reads or touches one process keeps track of at most (bounded memory). */
const MAX_TRACKED = 10_000;

/**
 * Sessions in the `http_session` table (its entity and migration own it): the id, the session's
 * JSON and its idle expiry in Unix seconds. A session whose expiry has passed is void; expired
 * rows are deleted by `purgeExpiredSessions` at each sign-in rather than on a timer in every
 * process.
 *
 * Reads are reused for `REUSE_READS_MS` (`server/http/reused-reads.ts`). What a session holds is
 * written at sign-in and not changed afterwards (the person, the CSRF token, the sign-in time), so
 * only its end matters: writing or destroying it through this process forgets the read at once; an
 * end decided by another process (sign-out there, an expired idle time) is seen within the window.
 */
export class SessionStore {
  private readonly reads = new ExpiringMap<string, string>(REUSE_READS_MS, MAX_TRACKED, REUSE_READS_SPREAD);
  private readonly lastWritten = new Map<string, number>();

  constructor(
    private readonly dataSource: DataSource,
    private readonly idleMs: number,
  ) {}

  /**
   * The stored JSON of a live session, or `undefined` when there is none (never stored, ended, or
   * idle too long): at once when a reused read holds it, else a read under way. Requests of one
   * session arriving together (a dashboard asks for several answers at once) share one read.
   */
  read(id: string): string | undefined | Promise<string | undefined> {
    return this.reads.load(id, async () => {
      const rows = (await this.dataSource.query('SELECT data FROM http_session WHERE session_id = ? AND expires >= ?', [id, nowSeconds()])) as Array<{ data: string | null }>;
      return rows[0]?.data ?? undefined;
    });
  }

  /** Stores a session's JSON with a fresh idle expiry. */
  async write(id: string, json: string): Promise<void> {
    this.reads.delete(id);
    await this.dataSource.query(
      'INSERT INTO http_session (session_id, expires, data) VALUES (?, ?, ?) ON DUPLICATE KEY UPDATE expires = VALUES(expires), data = VALUES(data)',
      [id, this.expiry(), json],
    );
    this.noteWritten(id);
  }

  /**
   * Renews a session's idle expiry, writing it at most once per `TOUCH_INTERVAL_MS` per session:
   * `undefined` when nothing was due, else the write under way.
   */
  touch(id: string): Promise<void> | undefined {
    if (Date.now() - (this.lastWritten.get(id) ?? 0) < TOUCH_INTERVAL_MS) return undefined;
    this.noteWritten(id);
    return this.dataSource.query('UPDATE http_session SET expires = ? WHERE session_id = ?', [this.expiry(), id]).then(() => undefined);
  }

  /** Ends a session. */
  async destroy(id: string): Promise<void> {
    this.reads.delete(id);
    this.lastWritten.delete(id);
    await this.dataSource.query('DELETE FROM http_session WHERE session_id = ?', [id]);
  }

  private expiry(): number {
    return Math.floor((Date.now() + this.idleMs) / 1000);
  }

  private noteWritten(id: string): void {
    // Entries older than the touch interval no longer matter, so a full map is simply emptied.
    if (this.lastWritten.size >= MAX_TRACKED) this.lastWritten.clear();
    this.lastWritten.set(id, Date.now());
  }
}

const nowSeconds = () => Math.floor(Date.now() / 1000);
