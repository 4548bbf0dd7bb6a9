import { Router } from 'express';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { installDemoScenario } from '@server/demo/install-demo';
import { Program } from '@server/entities/program.entity';
import type { AccessRule } from '@server/http/access';
import { allow } from '@server/http/access';
import { ROLES, type Role } from '@shared/schemas/roles';
import { signIn } from '../support/sign-in';
import { walkRoutes, type WalkedRoute } from '../support/route-walker';
import { buildTestApp, type TestApp } from '../support/test-app';
import { createTestDatabase, type TestDatabase } from '../support/test-database';
import { DEFAULT_PARAM_VALUE, ROUTE_SAMPLES } from './access-samples';

/** Who calls: nobody, each role for the matrix's program, each role agency-wide, people of another program, people without roles. */
interface Principal {
  name: string;
  grants: Array<{ role: Role; programId: 'this' | 'other' | null }>;
  signedIn: boolean;
}

const PRINCIPALS: Principal[] = [
  { name: 'signed out', grants: [], signedIn: false },
  { name: 'signed in without roles', grants: [], signedIn: true },
  ...ROLES.map((role) => ({ name: `${role} of this program`, grants: [{ role, programId: 'this' as const }], signedIn: true })),
  ...ROLES.map((role) => ({ name: `${role} agency-wide`, grants: [{ role, programId: null }], signedIn: true })),
  { name: 'every role, of another program', grants: ROLES.map((role) => ({ role, programId: 'other' as const })), signedIn: true },
];

/** The expected answer of the access gate, worked out here independently of the app's own check. */
function expected(rule: AccessRule, who: Principal): 'passes' | 401 | 403 {
  if (rule.kind === 'public') return 'passes';
  if (!who.signedIn) return 401;
  if (rule.kind === 'signed-in') return 'passes';
  const ok = who.grants.some((g) => rule.roles.includes(g.role) && (g.programId === null || (rule.scope === 'program' && g.programId === 'this')));
  return ok ? 'passes' : 403;
}

describe('route × role matrix', () => {
  let db: TestDatabase;
  let t: TestApp;
  let routes: WalkedRoute[];
  const agents = new Map<string, request.Agent | null>();
  let thisProgram: number;

  beforeAll(async () => {
    db = await createTestDatabase();
    thisProgram = (await installDemoScenario(db.dataSource)).programId;
    const other = await db.dataSource.getRepository(Program).save(
      db.dataSource.getRepository(Program).create({
        slug: 'matrix-other',
        name: 'Another program',
        description: 'For access tests.',
        scoreLabel: 'Score',
        scoreUnit: 'points',
        scoreMin: 0,
        scoreMax: 10,
        eligibleSide: 'at-or-below',
        timeZone: 'UTC',
      }),
    );
    t = buildTestApp(db);
    routes = walkRoutes(t.app);
    for (const who of PRINCIPALS) {
      if (!who.signedIn) {
        agents.set(who.name, null);
        continue;
      }
      const grants = who.grants.map((g) => ({ role: g.role, programId: g.programId === 'this' ? thisProgram : g.programId === 'other' ? other.id : null }));
      agents.set(who.name, await signIn(t, { grants }));
    }
  });
  afterAll(async () => {
    await db.drop();
  });

  it('finds the routes of the real app', () => {
    const names = routes.map((r) => `${r.method} ${r.path}`);
    expect(names).toEqual(expect.arrayContaining(['GET /api/me', 'GET /api/programs/:programId', 'POST /auth/saml/callback', 'GET /api/admin/audit']));
  });

  it('gives every API and sign-in route an access rule', () => {
    const missing = routes.filter((r) => (r.path.startsWith('/api') || r.path.startsWith('/auth')) && r.rule === null).map((r) => `${r.method} ${r.path}`);
    expect(missing, 'Routes without allow(...) as their first handler').toEqual([]);
  });

  it('scopes program routes by :programId, and only those', () => {
    const wrong = routes
      .filter((r) => r.rule)
      .filter((r) => {
        const scoped = r.rule!.kind === 'roles' && r.rule!.scope === 'program';
        return scoped !== r.path.includes(':programId');
      })
      .map((r) => `${r.method} ${r.path}`);
    expect(wrong, 'A path with :programId needs { kind: "roles", scope: "program" }, and that rule needs :programId in the path').toEqual([]);
  });

  it('notices a route whose first handler is not allow(...)', () => {
    const probe = buildTestApp(db).app;
    const extra = Router();
    extra.get('/api/unguarded', (_req, res) => void res.json({}));
    extra.get('/api/guarded', allow({ kind: 'signed-in' }), (_req, res) => void res.json({}));
    probe.use(extra);
    const found = walkRoutes(probe).filter((r) => r.path === '/api/unguarded' || r.path === '/api/guarded');
    expect(found.map((r) => [r.path, r.rule?.kind ?? null])).toEqual([
      ['/api/unguarded', null],
      ['/api/guarded', 'signed-in'],
    ]);
  });

  it('answers every API route for every caller as its rule says (401, 403 or through the gate)', async () => {
    const failures: string[] = [];
    let cells = 0;
    for (const route of routes.filter((r) => r.path.startsWith('/api') && r.rule)) {
      const sample = ROUTE_SAMPLES[`${route.method} ${route.path}`] ?? {};
      const url = route.path.replace(/:(\w+)/g, (_m, name: string) =>
        name === 'programId' ? String(thisProgram) : (sample.params?.[name] ?? DEFAULT_PARAM_VALUE),
      );
      for (const who of PRINCIPALS) {
        const agent = agents.get(who.name) ?? request(t.app);
        const method = route.method.toLowerCase() as 'get' | 'post' | 'put' | 'patch' | 'delete';
        let req = agent[method](url);
        if (sample.query) req = req.query(sample.query);
        if (sample.body !== undefined) req = req.send(sample.body as object);
        const res = await req;
        const want = expected(route.rule!, who);
        cells++;
        const ok = want === 'passes' ? res.status !== 401 && res.status !== 403 && res.status < 500 : res.status === want;
        if (!ok) failures.push(`${route.method} ${route.path} as ${who.name}: expected ${want}, got ${res.status} ${JSON.stringify(res.body?.error ?? '')}`);
        if (want === 401) expect(res.body.error.code).toBe('unauthenticated');
        if (want === 403) expect(res.body.error.code).toBe('forbidden');
      }
    }
    expect(failures).toEqual([]);
    expect(cells).toBeGreaterThanOrEqual(routes.filter((r) => r.path.startsWith('/api')).length * PRINCIPALS.length);
  });
});
