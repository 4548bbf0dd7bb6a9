import { Router } from 'express';
import { allow } from '../http/access';
import { checkHealth } from '../services/health.service';
import type { AppContext } from '../app-context';

export function healthRoutes(ctx: AppContext, router: Router = Router()): Router {
  router.get('/health', allow({ kind: 'public' }), async (_req, res) => {
    const health = await checkHealth(ctx.dataSource, ctx.config.version);
    res.status(health.status === 'ok' ? 200 : 503).json(health);
  });
  return router;
}
