/**
 * Every API route of the Express app, read from its router stack (Express 5 / router 2), so the
 * security tests cover routes added later without anyone listing them by hand.
 */
import type express from 'express';

export interface ApiRoute {
  method: string;
  /** As declared, e.g. /api/workspaces/:workspaceId/members/:userId */
  path: string;
}

interface Layer {
  rawPath?: unknown;
  slash?: boolean;
  route?: { path: unknown; methods: Record<string, boolean> };
  handle?: { stack?: Layer[] };
}

function walk(stack: Layer[], prefix: string, out: ApiRoute[]): void {
  for (const layer of stack) {
    if (layer.route) {
      if (typeof layer.route.path !== 'string') throw new Error(`A route with a non-string path under ${prefix}: the route list needs plain paths`);
      for (const [method, on] of Object.entries(layer.route.methods)) {
        if (on && method !== '_all') out.push({ method: method.toUpperCase(), path: prefix + layer.route.path });
      }
    } else if (layer.handle?.stack) {
      const mount = layer.slash || typeof layer.rawPath !== 'string' ? '' : layer.rawPath;
      walk(layer.handle.stack, prefix + mount, out);
    }
  }
}

export function apiRoutes(app: express.Express): ApiRoute[] {
  const router = (app as unknown as { router: { stack: Layer[] } }).router;
  const out: ApiRoute[] = [];
  walk(router.stack, '', out);
  const seen = new Set<string>();
  return out.filter((r) => r.path.startsWith('/api/') && !seen.has(`${r.method} ${r.path}`) && seen.add(`${r.method} ${r.path}`));
}

export const routeKey = (r: ApiRoute) => `${r.method} ${r.path}`;

const SAFE = new Set(['GET', 'HEAD', 'OPTIONS']);
export const isStateChanging = (r: ApiRoute) => !SAFE.has(r.method);
