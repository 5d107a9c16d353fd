import { randomUUID } from 'node:crypto';
import type { INestApplication } from '@nestjs/common';
import { ModulesContainer } from '@nestjs/core';

export interface RouterRoute {
  method: string;
  /** Express path, e.g. /api/runs/:id */
  path: string;
  /** 'GET /api/runs/:id' — the key of the roles-matrix table. */
  key: string;
}

interface Layer {
  route?: { path: string | string[]; methods: Record<string, boolean> };
  handle?: { stack?: Layer[] };
}

/**
 * Every route the running application answers under /api, read from the HTTP router itself (what is
 * served, whatever the documentation says): the Nest controllers and the API documentation.
 */
export function routerRoutes(app: INestApplication): RouterRoute[] {
  const instance = app.getHttpAdapter().getInstance() as { router?: { stack: Layer[] }; _router?: { stack: Layer[] } };
  const root = instance.router ?? instance._router;
  if (!root) throw new Error('cannot reach the HTTP router of the application');
  const out = new Map<string, RouterRoute>();
  const walk = (stack: Layer[]) => {
    for (const layer of stack) {
      if (layer.route) {
        const paths = Array.isArray(layer.route.path) ? layer.route.path : [layer.route.path];
        for (const path of paths) {
          if (typeof path !== 'string' || !path.startsWith('/api')) continue;
          for (const [m, on] of Object.entries(layer.route.methods)) {
            if (!on || m === '_all') continue;
            const method = m.toUpperCase();
            const key = `${method} ${path}`;
            out.set(key, { method, path, key });
          }
        }
      } else if (layer.handle?.stack) walk(layer.handle.stack);
    }
  };
  walk(root.stack);
  return [...out.values()].sort((a, b) => a.key.localeCompare(b.key));
}

/** A concrete path for a route: every :param becomes a fresh UUID (or `value` when given). */
export function concretePath(path: string, value?: (name: string) => string): string {
  return path.replace(/:([A-Za-z0-9_]+)/g, (_m, name: string) => encodeURIComponent(value ? value(name) : randomUUID()));
}

/** Socket event names the gateways subscribe to, read from the Nest metadata at runtime. */
export function gatewayEvents(app: INestApplication): string[] {
  const modules = app.get(ModulesContainer);
  const events = new Set<string>();
  for (const mod of modules.values()) {
    for (const wrapper of mod.providers.values()) {
      const instance = wrapper.instance as object | undefined;
      if (!instance || typeof instance !== 'object') continue;
      const ctor = (instance as { constructor: unknown }).constructor;
      if (!ctor || !Reflect.getMetadata('websockets:is_gateway', ctor as object)) continue;
      let proto = Object.getPrototypeOf(instance);
      while (proto && proto !== Object.prototype) {
        for (const name of Object.getOwnPropertyNames(proto)) {
          const fn = Object.getOwnPropertyDescriptor(proto, name)?.value;
          if (typeof fn !== 'function') continue;
          if (Reflect.getMetadata('websockets:message_mapping', fn)) {
            const msg = Reflect.getMetadata('message', fn);
            if (typeof msg === 'string') events.add(msg);
          }
        }
        proto = Object.getPrototypeOf(proto);
      }
    }
  }
  return [...events].sort();
}
