import { Router } from 'express';
import type { MeDto } from '@shared/api/auth';
import type { AppContext } from '../app-context';
import { sessionEndsAt } from '../auth/session';
import { allow } from '../http/access';
import { requireUser } from '../http/current-user';
import { grantsOfUsers } from '../services/grants.service';

export function meRoutes(ctx: AppContext, router: Router = Router()): Router {
  /** Who is signed in, their grants, the CSRF token of the session and when it ends. */
  router.get('/me', allow({ kind: 'signed-in' }), async (req, res) => {
    const user = requireUser(req);
    const grants = (await grantsOfUsers(ctx.dataSource.manager, [user.id])).get(user.id) ?? [];
    const body: MeDto = {
      user: { id: user.id, email: user.email, displayName: user.displayName },
      grants,
      csrfToken: req.session.csrfToken ?? '',
      session: {
        idleMinutes: ctx.config.auth.session.idleMinutes,
        endsAt: sessionEndsAt(ctx.config, req.session.signedInAt ?? Date.now()).toISOString(),
      },
      agency: ctx.config.agency,
    };
    res.set('Cache-Control', 'no-store').json(body);
  });
  return router;
}
