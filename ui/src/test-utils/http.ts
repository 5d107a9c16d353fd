import type { Role, SessionUser } from '@crankjournal/shared-types';
import { sessionStore } from '../api/session';

/** A JSON response as the service sends it. */
export function json(body: unknown, status = 200): Response {
  return new Response(JSON.stringify(body), { status, headers: { 'content-type': 'application/json' } });
}

/**
 * Signs a demo person of the given role in (tokens are never checked by the stubbed fetch). Give `tokens` when the
 * code under test looks at the token's shape (e.g. a three-part JWT-like `a.b.c`).
 */
export function signIn(role: Role, over: Partial<SessionUser> = {}, tokens: { accessToken?: string } = {}): SessionUser {
  const user: SessionUser = {
    id: 'u1',
    email: 'x@alderforge.example',
    displayName: 'Test Person',
    role,
    unitSystem: 'imperial',
    ...over,
  };
  sessionStore.set({ accessToken: 'a', ...tokens, user });
  return user;
}

/** Signs out (run after each test that signed in). */
export function signOut(): void {
  sessionStore.set(null);
}

export interface StubRequest {
  method: string;
  url: string;
  /** The path without the `/api` prefix and without the query string. */
  path: string;
  query: URLSearchParams;
  body: unknown;
  init: RequestInit | undefined;
}
type Handler = (req: StubRequest) => Response | Promise<Response>;
interface Route {
  method: string;
  pattern: RegExp;
  handler: Handler;
}

/** `GET /runs/:id/alarms` → method and a path pattern (`:name` one segment, `*` anything). */
function parseKey(key: string, value: unknown): Route {
  const [method, path] = key.includes(' ') ? (key.split(' ', 2) as [string, string]) : ['*', key];
  const source = path
    .replace(/[.+?^${}()|[\]\\]/g, '\\$&')
    .replace(/:\w+/g, '[^/]+')
    .replace(/\*/g, '.*');
  const handler: Handler = typeof value === 'function' ? (value as Handler) : () => json(value);
  return { method: method.toUpperCase(), pattern: new RegExp(`^${source}$`), handler };
}

/**
 * The one fetch stub of the UI tests: routes by `METHOD /path` (or `/path` for any method; `:name` matches a
 * segment, `*` anything); a value answers as JSON, a function gets the request. A later route wins over an earlier
 * one, so put a catch-all `*` first.
 * An unrouted request answers 404 so a test sees it. `calls` lists what was asked, in order.
 */
export function stubFetch(routes: Record<string, Handler | unknown> = {}) {
  const table: Route[] = Object.entries(routes).map(([key, value]) => parseKey(key, value));
  const calls: StubRequest[] = [];
  const spy = vi.spyOn(globalThis, 'fetch').mockImplementation(async (input, init) => {
    const url = String(input);
    const u = new URL(url, 'http://localhost');
    const path = u.pathname.replace(/^\/api/, '');
    const raw = init?.body;
    const body = typeof raw === 'string' ? (JSON.parse(raw) as unknown) : raw;
    const req: StubRequest = { method: (init?.method ?? 'GET').toUpperCase(), url, path, query: u.searchParams, body, init };
    calls.push(req);
    for (const r of [...table].reverse()) {
      if (r.method !== '*' && r.method !== req.method) continue;
      if (r.pattern.test(path)) return r.handler(req);
    }
    return json({ statusCode: 404, message: `No stub for ${req.method} ${path}` }, 404);
  });
  return {
    spy,
    calls,
    /** Adds or replaces a route (e.g. a later answer in the same test). */
    on(key: string, value: Handler | unknown) {
      table.push(parseKey(key, value));
    },
    /** Forgets the requests asked so far (routes stay). */
    clearCalls() {
      calls.length = 0;
      spy.mockClear();
    },
  };
}
