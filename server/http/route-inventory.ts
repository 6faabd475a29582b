import type { Express } from 'express';
import { ACCESS, type Access } from '../auth/policy';

export interface RouteEntry {
  method: string;
  path: string;
  access: Access | undefined;
}

interface Layer {
  route?: { path: string; stack: { method?: string; handle: unknown }[] };
  handle: { stack?: Layer[] } & Record<symbol, unknown>;
}

/**
 * Every route the app serves, with the access rule its first handler declares (undefined when it
 * declares none). API routers are mounted on /api without a prefix of their own.
 */
export function listRoutes(app: Express): RouteEntry[] {
  const out: RouteEntry[] = [];
  const walk = (stack: Layer[], prefix: string) => {
    for (const layer of stack) {
      if (layer.route) {
        const first = layer.route.stack[0]?.handle as Record<symbol, unknown> | undefined;
        const methods = [...new Set(layer.route.stack.map((s) => s.method).filter(Boolean))] as string[];
        for (const method of methods) {
          out.push({ method: method.toUpperCase(), path: prefix + layer.route.path, access: first?.[ACCESS] as Access | undefined });
        }
      } else if (layer.handle?.stack) {
        walk(layer.handle.stack, prefix || (isApiRouter(layer.handle.stack) ? '/api' : ''));
      }
    }
  };
  const root = (app as unknown as { router: { stack: Layer[] } }).router;
  walk(root.stack, '');
  return out;
}

function isApiRouter(stack: Layer[]): boolean {
  return stack.some((l) => l.handle?.stack?.some((x) => x.route?.path === '/health'));
}
