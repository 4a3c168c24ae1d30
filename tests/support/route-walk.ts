/**
 * Every route an Express 5 app answers, as "METHOD /full/path", found by walking the router stack:
 * a layer with `route` is an endpoint (route.path, route.methods); a layer whose handle has a `stack`
 * is a mounted router, whose mount path (layer.rawPath, unless mounted at "/") prefixes its routes.
 * A mount path that is not a plain string (a RegExp, an array) is reported so the matrix cannot
 * silently miss what it cannot name.
 */
import type { Express } from 'express';

interface LayerLike {
  route?: { path: unknown; methods: Record<string, boolean> };
  handle?: { stack?: LayerLike[] };
  rawPath?: unknown;
  slash?: boolean;
}

export function listRoutes(app: Express): string[] {
  const out: string[] = [];
  const walk = (stack: LayerLike[], prefix: string) => {
    for (const layer of stack) {
      if (layer.route) {
        const paths = Array.isArray(layer.route.path) ? layer.route.path : [layer.route.path];
        for (const p of paths) {
          if (typeof p !== 'string') throw new Error(`a route under ${prefix || '/'} has a non-string path (${String(p)}): give it a plain path so the matrix can list it`);
          for (const m of Object.keys(layer.route.methods).filter((k) => k !== '_all')) out.push(`${m.toUpperCase()} ${prefix}${p}`);
          if (layer.route.methods._all) out.push(`ALL ${prefix}${p}`);
        }
      } else if (layer.handle?.stack) {
        let mount = '';
        if (!layer.slash) {
          if (typeof layer.rawPath !== 'string') throw new Error(`a router is mounted on a non-string path under ${prefix || '/'}`);
          mount = layer.rawPath === '/' ? '' : layer.rawPath.replace(/\/$/, '');
        }
        walk(layer.handle.stack, prefix + mount);
      }
    }
  };
  walk((app as unknown as { router: { stack: LayerLike[] } }).router.stack, '');
  return out;
}
