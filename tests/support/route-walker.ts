import type { Express } from 'express';
import type { AccessRule } from '@server/http/access';

/** One route of the app as Express holds it. */
export interface WalkedRoute {
  method: string;
  /** Full path with parameters, e.g. `/api/programs/:programId`. */
  path: string;
  /** The rule of the route's first handler, or null when it has none. */
  rule: AccessRule | null;
}

interface LayerLike {
  rawPath?: unknown;
  method?: string;
  handle?: { stack?: LayerLike[]; accessRule?: AccessRule };
  route?: { path: unknown; methods: Record<string, boolean>; stack: LayerLike[] };
}

/**
 * Every route of an Express 5 app (router 2.x layers), with mount paths joined and the access
 * rule of each method's first handler. This reads Express's internals on purpose: the test must
 * see the routes the app really serves, not a list someone keeps by hand.
 */
export function walkRoutes(app: Express): WalkedRoute[] {
  const out: WalkedRoute[] = [];
  walk((app as unknown as { router: { stack: LayerLike[] } }).router.stack, '', out);
  return out;
}

function walk(stack: LayerLike[], prefix: string, out: WalkedRoute[]): void {
  for (const layer of stack) {
    if (layer.route) {
      for (const path of asPaths(layer.route.path)) {
        for (const method of Object.keys(layer.route.methods)) {
          const first = layer.route.stack.find((l) => l.method === method || l.method === undefined);
          out.push({ method: method === '_all' ? 'ALL' : method.toUpperCase(), path: join(prefix, path), rule: first?.handle?.accessRule ?? null });
        }
      }
    } else if (Array.isArray(layer.handle?.stack)) {
      for (const mount of asPaths(layer.rawPath)) walk(layer.handle.stack, `${prefix}${mount.replace(/\/$/, '')}`, out);
    }
  }
}

function asPaths(value: unknown): string[] {
  return (Array.isArray(value) ? value : [value]).map((p) => (typeof p === 'string' ? p : String(p)));
}

function join(prefix: string, path: string): string {
  const joined = `${prefix}${path === '/' ? '' : path}`;
  return joined === '' ? '/' : joined;
}
