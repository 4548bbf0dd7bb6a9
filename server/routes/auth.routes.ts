import express, { Router, type Response } from 'express';
import { safeReturnPath, type SignInRefusal } from '@shared/schemas/sign-in';
import type { AppContext } from '../app-context';
import type { SignInOutcome } from '../auth/complete-sign-in';
import { csrfTokenMatches, newCsrfToken } from '../auth/csrf';
import { purgeExpiredSessions, SESSION_COOKIE } from '../auth/session';
import type { SignIn } from '../auth/sign-in';
import { refusalFromError } from '../auth/sign-in-refusal';
import { signInRateLimit } from '../auth/sign-in-rate-limit';
import { allow } from '../http/access';
import { actorOf, type CurrentUser } from '../http/current-user';
import { csrfInvalid } from '../lib/errors';
import { recordAudit, type AuditActor } from '../services/audit.service';

const formBody = express.urlencoded({ extended: false, limit: '1mb' });

/**
 * SAML sign-in and sign-out, mounted at /auth (outside /api: these are browser navigations and
 * form posts, answered with redirects rather than JSON).
 */
export function authRoutes(ctx: AppContext, signIn: SignIn): Router {
  const router = Router();
  const limit = signInRateLimit(ctx.config);
  // `req.login` and `req.logout`, used below; the API needs neither (`restoreSignedInPerson`).
  router.use(signIn.passport.initialize());

  /** Starts a sign-in: redirect to the identity provider. `?returnTo=/path` comes back as RelayState. */
  router.get('/saml/login', allow({ kind: 'public' }), limit, async (req, res) => {
    const returnTo = safeReturnPath(req.query.returnTo);
    const url = await signIn.strategy._saml!.getAuthorizeUrlAsync(returnTo, req.headers.host, {});
    res.redirect(302, url);
  });

  /** The assertion consumer service: the identity provider posts its signed answer here. */
  router.post('/saml/callback', allow({ kind: 'public' }), limit, formBody, (req, res, next) => {
    const refuse = (reason: SignInRefusal, actor: AuditActor = { userId: null, label: 'anonymous' }) => {
      ctx.logger.warn({ reason }, 'sign-in refused');
      recordAudit(ctx.dataSource.manager, { actor, action: 'auth.sign-in-refused', details: { reason } }).then(
        () => res.redirect(303, `/sign-in?error=${reason}`),
        next,
      );
    };
    // Without an answer passport-saml would start a new sign-in; a post here must carry one.
    if (typeof (req.body as { SAMLResponse?: unknown } | undefined)?.SAMLResponse !== 'string') return refuse('failed');
    signIn.passport.authenticate('saml', { session: false }, (err: unknown, user: CurrentUser | false, info?: SignInOutcome) => {
      if (err || !user) {
        if (err) return refuse(refusalFromError(err));
        return info && !info.ok ? refuse(info.reason, info.actor) : refuse('failed');
      }
      // passport regenerates the session here: a session id planted before sign-in is never promoted.
      req.login(user, (loginErr) => {
        if (loginErr) return next(loginErr);
        req.session.csrfToken = newCsrfToken();
        req.session.signedInAt = Date.now();
        req.session.save(async (saveErr) => {
          if (saveErr) return next(saveErr);
          try {
            await recordAudit(ctx.dataSource.manager, { actor: actorOf(req), action: 'auth.sign-in', details: { method: 'saml', grants: user.grants.length } });
            await purgeExpiredSessions(ctx.dataSource);
            ctx.logger.info({ userId: user.id }, 'signed in');
            res.redirect(303, safeReturnPath((req.body as { RelayState?: unknown }).RelayState));
          } catch (auditErr) {
            next(auditErr);
          }
        });
      });
    })(req, res, next);
  });

  /** Cutline's service-provider metadata, for the identity provider's administrators. */
  router.get('/saml/metadata', allow({ kind: 'public' }), (_req, res) => {
    res.type('application/samlmetadata+xml').send(signIn.strategy.generateServiceProviderMetadata(null, null));
  });

  /** Signs out of Cutline (a plain form post carrying `_csrf`, or a fetch with the header). */
  router.post('/logout', allow({ kind: 'public' }), formBody, async (req, res, next) => {
    if (!req.user) return endSignOut(res);
    if (!csrfTokenMatches(req)) return next(csrfInvalid());
    const actor = actorOf(req);
    req.logout((err) => {
      if (err) return next(err);
      // passport leaves a fresh empty session behind; nothing needs it.
      req.session.destroy((destroyErr) => {
        if (destroyErr) return next(destroyErr);
        recordAudit(ctx.dataSource.manager, { actor, action: 'auth.sign-out' }).then(() => endSignOut(res), next);
      });
    });
  });

  function endSignOut(res: Response): void {
    const { cookieSecure } = ctx.config.auth.session;
    res.clearCookie(SESSION_COOKIE, { path: '/', httpOnly: true, sameSite: 'lax', secure: cookieSecure });
    res.redirect(303, '/sign-in?signedOut=1');
  }

  return router;
}

