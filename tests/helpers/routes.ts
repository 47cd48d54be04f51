import type { Express } from 'express';

import type { AccessRule } from '../../server/http/access';

export type DeclaredRoute = { method: string; pattern: string; rule: AccessRule | undefined };

type Layer = {
  route?: { path: string; methods: Record<string, boolean>; stack: Layer[] };
  handle: ((...args: unknown[]) => unknown) & { stack?: Layer[]; accessRule?: AccessRule };
  rawPath?: string;
};

const join = (prefix: string, path: string) => (`${prefix}/${path}`.replace(/\/+/g, '/').replace(/(.)\/$/, '$1'));

/**
 * Every route the app answers, with the access rule that guards it: the first guard in the route's own
 * handlers, or one applied with `use` to the router that holds it. Reads Express 5's router stack.
 */
export function listRoutes(app: Express): DeclaredRoute[] {
  const routes: DeclaredRoute[] = [];
  const walk = (stack: Layer[], prefix: string, inherited: AccessRule | undefined) => {
    let current = inherited;
    for (const layer of stack) {
      if (layer.route) {
        const own = layer.route.stack.find((l) => l.handle.accessRule)?.handle.accessRule;
        for (const method of Object.keys(layer.route.methods)) {
          if (method === '_all') continue;
          routes.push({ method: method.toUpperCase(), pattern: join(prefix, layer.route.path), rule: own ?? current });
        }
      } else if (layer.handle.stack) {
        walk(layer.handle.stack, join(prefix, typeof layer.rawPath === 'string' ? layer.rawPath : ''), current);
      } else if (layer.handle.accessRule && (layer.rawPath === '/' || layer.rawPath === undefined)) {
        // A guard applied with router.use() covers every route after it in that router.
        current = layer.handle.accessRule;
      }
    }
  };
  walk((app as unknown as { router: { stack: Layer[] } }).router.stack, '', undefined);
  return routes;
}
