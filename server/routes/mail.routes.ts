import { Router } from 'express';
import { PageQuerySchema } from '@shared/schemas/paging';
import { SubscriptionUpdateSchema } from '@shared/schemas/subscription';
import type { AppContext } from '../app-context';
import { actorOf, requireUser } from '../http/current-user';
import { allow } from '../http/access';
import { idParam, parse } from '../http/validate';
import { getSentMail, listSentMail } from '../services/mail-log.service';
import { getSubscription, updateSubscription } from '../services/subscriptions.service';

/** The director's own summary settings, and the administrators' *Sent mail* pages. */
export function mailRoutes(ctx: AppContext, router: Router = Router()): Router {
  router.get('/me/subscription', allow({ kind: 'signed-in' }), async (req, res) => {
    res.json(await getSubscription(ctx.dataSource, requireUser(req).id, new Date()));
  });
  router.put('/me/subscription', allow({ kind: 'signed-in' }), async (req, res) => {
    const user = requireUser(req);
    res.json(await updateSubscription(ctx.dataSource, { ...actorOf(req), userId: user.id }, parse(SubscriptionUpdateSchema, req.body), new Date()));
  });
  router.get('/admin/mail', allow({ kind: 'roles', roles: ['admin'], scope: 'agency' }), async (req, res) => {
    res.json(await listSentMail(ctx.dataSource, ctx.config, parse(PageQuerySchema, req.query)));
  });
  router.get('/admin/mail/:messageId', allow({ kind: 'roles', roles: ['admin'], scope: 'agency' }), async (req, res) => {
    res.json(await getSentMail(ctx.dataSource, ctx.config, idParam(req.params.messageId, 'Message id')));
  });
  return router;
}
