import type express from 'express';

/** What a route's guard allows; attached to the guard middleware so the route table can read it. */
export type AccessRule = { kind: 'public' } | { kind: 'signed-in' } | { kind: 'roles'; roles: string[] };

export type RouteEntry = { method: string; path: string; access: AccessRule | null };

export function markAccess<T extends object>(handler: T, rule: AccessRule): T {
  Object.defineProperty(handler, 'coppiceAccess', { value: rule, enumerable: false });
  return handler;
}

type Layer = {
  route?: { path: string; methods: Record<string, boolean>; stack: Array<{ handle: unknown }> };
  handle?: { stack?: Layer[]; coppiceAccess?: AccessRule };
  name?: string;
};

/**
 * Every route the app serves, with the access rule of its guard (null when it has none). The
 * authorization matrix test is generated from this, so a route added without a guard fails it.
 */
export function routeTable(app: express.Express): RouteEntry[] {
  const out: RouteEntry[] = [];
  const walk = (stack: Layer[], inherited: AccessRule | null) => {
    let routerLevel = inherited;
    for (const layer of stack) {
      const rule = (layer.handle as { coppiceAccess?: AccessRule } | undefined)?.coppiceAccess;
      if (!layer.route && rule) routerLevel = rule;
      if (layer.route) {
        const guard = layer.route.stack
          .map((l) => (l.handle as { coppiceAccess?: AccessRule }).coppiceAccess)
          .find((r): r is AccessRule => Boolean(r));
        for (const method of Object.keys(layer.route.methods)) {
          if (method === '_all') continue;
          out.push({ method: method.toUpperCase(), path: layer.route.path, access: guard ?? routerLevel });
        }
      } else if (layer.handle?.stack) {
        walk(layer.handle.stack, routerLevel);
      }
    }
  };
  const router = (app as unknown as { router: { stack: Layer[] } }).router;
  walk(router.stack, null);
  return out;
}
