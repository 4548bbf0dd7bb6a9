import type { RequestHandler } from 'express';
import session from 'express-session';
import MySQLStoreFactory from 'express-mysql-session';
import type { DataSource } from 'typeorm';
import type { Config } from '../config/env';
import { REUSE_READS_MS, REUSE_READS_SPREAD } from '../http/reused-reads';
import { ExpiringMap } from '../lib/expiring-map';

/** Name of the session cookie. */
export const SESSION_COOKIE = 'cutline.sid';

declare module 'express-session' {
  interface SessionData {
    /** Synchronizer token for state-changing requests (`server/auth/csrf.ts`). */
    csrfToken: string;
    /** When the person signed in (ms since epoch), for the absolute timeout. */
    signedInAt: number;
  }
}

declare global {
  // eslint-disable-next-line @typescript-eslint/no-namespace
  namespace Express {
    interface Request {
      /** Set when the request carried a session cookie whose session has ended (idle or absolute timeout, account switched off). */
      sessionEnded?: boolean;
    }
  }
}

const MySQLStore = MySQLStoreFactory(session);

/**
 * express-session backed by the `http_session` table (created by a migration, so the store never
 * creates tables). The store's queries go through TypeORM's pool. The store ignores expired rows;
 * `purgeExpiredSessions` deletes them at each sign-in rather than on a timer in every instance.
 */
export function sessionMiddleware(config: Config, dataSource: DataSource): RequestHandler {
  const connection = {
    // express-mysql-session accepts any object whose query() returns [rows, fields].
    query: async (sql: string, params: unknown[]) => [await dataSource.query(sql, params), undefined],
  };
  const store = new MySQLStore(
    {
      createDatabaseTable: false,
      clearExpired: false,
      // The idle timeout lives here, in each stored session's expiry, renewed on use (`throttleTouches`).
      expiration: config.auth.session.idleMinutes * 60_000,
      endConnectionOnClose: false,
      schema: { tableName: 'http_session', columnNames: { session_id: 'session_id', expires: 'expires', data: 'data' } },
    },
    connection as never,
  );
  throttleTouches(store, TOUCH_INTERVAL_MS);
  reuseSessionReads(store, new ExpiringMap<string, string>(REUSE_READS_MS, 10_000, REUSE_READS_SPREAD));
  return session({
    name: SESSION_COOKIE,
    secret: config.secrets.sessionSecret,
    store,
    resave: false,
    saveUninitialized: false,
    // A browser-session cookie, set once at sign-in: the idle timeout is the stored expiry's, so
    // answers carry no Set-Cookie (re-signing and re-sending the cookie on every answer cost about
    // a seventh of a cached dashboard answer's CPU). Closing the browser drops the cookie.
    rolling: false,
    cookie: {
      httpOnly: true,
      sameSite: 'lax',
      secure: config.auth.session.cookieSecure,
      path: '/',
    },
  });
}

/**
 * How often one process writes a session's renewed idle expiry (ms). express-session touches the
 * store on every request; writing it at most once a minute per session moves the idle timeout by
 * at most a minute and spares the database an UPDATE per request.
 */
export const TOUCH_INTERVAL_MS = 60_000;

type TouchFn = (sid: string, data: unknown, callback?: (err?: unknown) => void) => void;

function throttleTouches(store: session.Store, intervalMs: number): void {
  const touch = (store as unknown as { touch?: TouchFn }).touch?.bind(store);
  if (!touch) return;
  const lastTouched = new Map<string, number>();
  (store as unknown as { touch: TouchFn }).touch = (sid, data, callback) => {
    const now = Date.now();
    if (now - (lastTouched.get(sid) ?? 0) < intervalMs) return callback?.();
    // Bounded: entries older than the interval are useless, so the map is emptied when it grows.
    if (lastTouched.size > 10_000) lastTouched.clear();
    lastTouched.set(sid, now);
    touch(sid, data, callback);
  };
}

type GetFn = (sid: string, callback: (err: unknown, session?: session.SessionData | null) => void) => void;
type ChangeFn = (sid: string, ...rest: never[]) => void;

/**
 * Reuses a session read for `REUSE_READS_MS` (`server/http/reused-reads.ts`). What a session holds
 * is written at sign-in and never changes afterwards (the person, the CSRF token, the sign-in
 * time), so only its end matters: saving or destroying it here forgets it at once; an end decided
 * by another process (sign-out there, an expired idle time) is seen within the window. Each request
 * gets its own copy, since express-session changes the object it is given.
 */
function reuseSessionReads(store: session.Store, reads: ExpiringMap<string, string>): void {
  const writable = store as unknown as { get: GetFn; set: ChangeFn; destroy: ChangeFn };
  const get = writable.get.bind(store);
  const read = (sid: string) =>
    new Promise<string | undefined>((resolve, reject) => get(sid, (err, found) => (err ? reject(err as Error) : resolve(found ? JSON.stringify(found) : undefined))));
  writable.get = (sid, callback) => {
    const kept = reads.get(sid);
    if (kept !== undefined) return callback(null, JSON.parse(kept) as session.SessionData);
    // Concurrent requests of one session (a dashboard asks for several answers at once) share a read.
    reads.load(sid, () => read(sid)).then(
      (found) => callback(null, found === undefined ? null : (JSON.parse(found) as session.SessionData)),
      (err: unknown) => callback(err),
    );
  };
  for (const method of ['set', 'destroy'] as const) {
    const change = writable[method].bind(store);
    writable[method] = (sid, ...rest) => {
      reads.delete(sid);
      change(sid, ...rest);
    };
  }
}

/** Whether the request carries Cutline's session cookie at all. */
export function hasSessionCookie(cookieHeader: string | undefined): boolean {
  return (cookieHeader ?? '').split(';').some((part) => part.trim().startsWith(`${SESSION_COOKIE}=`));
}

/**
 * Ends sessions older than the absolute timeout and marks requests whose session cookie no longer
 * names a live session, so the API can answer `session_expired` instead of a bare "please sign in".
 * Runs after passport has loaded `req.user`.
 */
export function sessionLifetime(config: Config): RequestHandler {
  const absoluteMs = config.auth.session.absoluteHours * 3_600_000;
  return (req, _res, next) => {
    if (req.user) {
      const signedInAt = req.session.signedInAt ?? 0;
      if (Date.now() - signedInAt < absoluteMs) return next();
      // Destroyed rather than logged out: logging out would store a fresh empty session.
      req.session.destroy((err) => {
        req.user = undefined;
        req.sessionEnded = true;
        next(err);
      });
      return;
    }
    req.sessionEnded = hasSessionCookie(req.headers.cookie);
    next();
  };
}

/** When the session ends at the latest (absolute timeout). */
export function sessionEndsAt(config: Config, signedInAt: number): Date {
  return new Date(signedInAt + config.auth.session.absoluteHours * 3_600_000);
}

/** Deletes up to `limit` expired sessions (the index on `expires` keeps this cheap). */
export async function purgeExpiredSessions(dataSource: DataSource, limit = 1000): Promise<void> {
  await dataSource.query('DELETE FROM http_session WHERE expires < ? LIMIT ?', [Math.floor(Date.now() / 1000), limit]);
}
