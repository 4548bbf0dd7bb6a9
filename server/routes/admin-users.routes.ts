import { Router } from 'express';
import { GrantCreateSchema, UserCreateSchema, UserListQuerySchema, UserUpdateSchema } from '@shared/schemas/users';
import type { AppContext } from '../app-context';
import { allow } from '../http/access';
import { actorOf } from '../http/current-user';
import { idParam, parse } from '../http/validate';
import { addGrant, revokeGrant } from '../services/grants.service';
import { createUser, getUser, listUsers, updateUser } from '../services/users.service';

const AGENCY_ADMIN = { kind: 'roles', roles: ['admin'], scope: 'agency' } as const;

/** People and their role grants; agency-wide administrators only. */
export function adminUserRoutes(ctx: AppContext, router: Router = Router()): Router {
  router.get('/admin/users', allow(AGENCY_ADMIN), async (req, res) => {
    res.json(await listUsers(ctx.dataSource, parse(UserListQuerySchema, req.query)));
  });
  router.post('/admin/users', allow(AGENCY_ADMIN), async (req, res) => {
    res.status(201).json(await createUser(ctx.dataSource, actorOf(req), parse(UserCreateSchema, req.body)));
  });
  router.get('/admin/users/:userId', allow(AGENCY_ADMIN), async (req, res) => {
    res.json(await getUser(ctx.dataSource, idParam(req.params.userId, 'Person id')));
  });
  router.patch('/admin/users/:userId', allow(AGENCY_ADMIN), async (req, res) => {
    res.json(await updateUser(ctx.dataSource, actorOf(req), idParam(req.params.userId, 'Person id'), parse(UserUpdateSchema, req.body)));
  });
  router.post('/admin/users/:userId/grants', allow(AGENCY_ADMIN), async (req, res) => {
    res.status(201).json(await addGrant(ctx.dataSource, actorOf(req), idParam(req.params.userId, 'Person id'), parse(GrantCreateSchema, req.body)));
  });
  router.delete('/admin/grants/:grantId', allow(AGENCY_ADMIN), async (req, res) => {
    await revokeGrant(ctx.dataSource, actorOf(req), idParam(req.params.grantId, 'Grant id'));
    res.status(204).end();
  });
  return router;
}
