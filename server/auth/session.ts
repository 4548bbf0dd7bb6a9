import type { CookieOptions, Request, RequestHandler, Response } from 'express';
import type { DataSource } from 'typeorm';
import type { Config } from '../config/env';
import { newSessionId, SESSION_COOKIE, sessionCookieValue, sessionIdVerifier, signedSessionCookie } from './session-cookie';
import { SessionStore } from './session-store';

export { SESSION_COOKIE } from './session-cookie';
export { TOUCH_INTERVAL_MS } from './session-store';

/** What a session holds, all written at sign-in. */
export interface SessionData {
  /** passport's record of the signed-in person (`{ user: id }`, passport's layout). */
  passport?: { user?: unknown };
  /** Synchronizer token for state-changing requests (`server/auth/csrf.ts`). */
  csrfToken?: string;
  /** When the person signed in (ms since epoch), for the absolute timeout. */
  signedInAt?: number;
}

declare global {
  // eslint-disable-next-line @typescript-eslint/no-namespace
  namespace Express {
    interface Request {
      /** The request's session (`sessionMiddleware`): the stored one its cookie names, or a new unsaved one. */
      session: Session;
      /** Set when the request carried a session cookie whose session has ended (idle or absolute timeout, account switched off). */
      sessionEnded?: boolean;
    }
  }
}

/** What a request's sessions share: where they are stored, how the cookie is made, which id the request's cookie names. */
interface SessionContext {
  req: Request;
  res: Response;
  store: SessionStore;
  secret: string;
  cookie: CookieOptions;
  cookieId: string | undefined;
}

/**
 * A request's session: its data as own properties (passport reads and writes `session.passport`),
 * and the calls passport makes (`save`, `regenerate`). Nothing is stored unless `save` is called:
 * every change to a session in Cutline is made at sign-in or sign-out, followed by a save.
 */
export class Session implements SessionData {
  declare passport?: { user?: unknown };
  declare csrfToken?: string;
  declare signedInAt?: number;
  declare readonly id: string;
  declare private readonly context: SessionContext;

  constructor(context: SessionContext, id: string, data: SessionData) {
    // Not session data, so not enumerable: `JSON.stringify(session)` is exactly what is stored.
    Object.defineProperties(this, { id: { value: id }, context: { value: context } });
    // The known fields only: a stored key can never shadow a method.
    if (data.passport !== undefined) this.passport = data.passport;
    if (data.csrfToken !== undefined) this.csrfToken = data.csrfToken;
    if (data.signedInAt !== undefined) this.signedInAt = data.signedInAt;
  }

  /** Stores the session; the first time under this id, also sets the cookie naming it. */
  save(callback: (err?: unknown) => void = noop): void {
    const context = this.context;
    context.store.write(this.id, JSON.stringify(this)).then(() => {
      if (context.cookieId === this.id) return callback();
      if (context.res.headersSent) return callback(new Error('A new session was saved after the answer had begun, so its cookie could not be set.'));
      context.res.cookie(SESSION_COOKIE, signedSessionCookie(this.id, context.secret), context.cookie);
      context.cookieId = this.id;
      callback();
    }, callback);
  }

  /** Ends the session; the request goes on with a new, empty, unsaved one (`req.session`). */
  destroy(callback: (err?: unknown) => void = noop): void {
    const context = this.context;
    const stored = context.cookieId === this.id;
    (stored ? context.store.destroy(this.id) : Promise.resolve()).then(() => {
      context.req.session = new Session(context, newSessionId(), {});
      callback();
    }, callback);
  }

  /**
   * passport's call at sign-in and sign-out: a new id, so a session id planted before sign-in is
   * never promoted (session fixation).
   */
  regenerate(callback: (err?: unknown) => void): void {
    this.destroy(callback);
  }
}

const noop = () => undefined;

/**
 * Sessions in the `http_session` table (`session-store.ts`) named by a signed cookie
 * (`session-cookie.ts`). A browser-session cookie, set once when a session is first saved (at
 * sign-in), so answers carry no Set-Cookie; the idle timeout is the stored expiry's, renewed on
 * use; closing the browser drops the cookie. Written for Cutline rather than taken from
 * express-session, which on every request hashed the session three times and computed three more
 * hashes to check the cookie: with its store, about a third of a cached dashboard answer's CPU in
 * an in-process comparison.
 */
export function sessionMiddleware(config: Config, dataSource: DataSource): RequestHandler {
  const store = new SessionStore(dataSource, config.auth.session.idleMinutes * 60_000);
  const secret = config.secrets.sessionSecret;
  const verifiedId = sessionIdVerifier(secret);
  const cookie: CookieOptions = { httpOnly: true, sameSite: 'lax', secure: config.auth.session.cookieSecure, path: '/' };
  return (req, res, next) => {
    const value = sessionCookieValue(req.headers.cookie);
    const id = value === undefined ? undefined : verifiedId(value);
    const context: SessionContext = { req, res, store, secret, cookie, cookieId: undefined };
    const startFresh = () => {
      req.session = new Session(context, newSessionId(), {});
      next();
    };
    if (id === undefined) return startFresh();
    const resume = (json: string | undefined) => {
      const data = parseSession(json);
      if (!data) return startFresh();
      context.cookieId = id;
      req.session = new Session(context, id, data);
      const touching = store.touch(id);
      if (touching) touching.then(() => next(), next);
      else next();
    };
    // Most requests find their session in a reused read and go on without waiting for anything.
    const stored = store.read(id);
    if (stored instanceof Promise) stored.then(resume, next);
    else resume(stored);
  };
}

/** A stored session's data; a row that is not a JSON object (damaged) counts as no session. */
function parseSession(json: string | undefined): SessionData | undefined {
  if (json === undefined) return undefined;
  try {
    const data = JSON.parse(json) as unknown;
    return data && typeof data === 'object' && !Array.isArray(data) ? (data as SessionData) : undefined;
  } catch {
    return undefined;
  }
}

/** Whether the request carries Cutline's session cookie at all. */
export function hasSessionCookie(cookieHeader: string | undefined): boolean {
  return sessionCookieValue(cookieHeader) !== undefined;
}

/**
 * Ends sessions older than the absolute timeout and marks requests whose session cookie no longer
 * names a live session, so the API can answer `session_expired` instead of a bare "please sign in".
 * Runs after `restoreSignedInPerson` (`sign-in.ts`) has set `req.user`.
 */
export function sessionLifetime(config: Config): RequestHandler {
  const absoluteMs = config.auth.session.absoluteHours * 3_600_000;
  return (req, _res, next) => {
    if (req.user) {
      const signedInAt = req.session.signedInAt ?? 0;
      if (Date.now() - signedInAt < absoluteMs) return next();
      // Destroyed rather than logged out: passport's logout writes the session once more first.
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
