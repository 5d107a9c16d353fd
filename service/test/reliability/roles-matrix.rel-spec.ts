/**
 * Roles matrix: every route the router serves and every socket event, for every role, without a token and
 * with an expired token, against the one table in test/roles-matrix.table.ts. A route or event missing from
 * the table fails with a message saying which row to add.
 */
import { randomUUID } from 'node:crypto';
import type { Socket } from 'socket.io-client';
import { ROLES, type Role } from '@crankjournal/shared-types';
import { startTestApp } from '../utils/test-app.js';
import { connected, socketAs } from '../utils/socket.js';
import { authHeader } from '../utils/signed-in.js';
import { createEngine } from '../factories/engine.factory.js';
import { ROUTE_ACCESS, SOCKET_ACCESS, type RouteAccess } from '../roles-matrix.table.js';
import { ROOM_RULES } from '../../src/modules/live/room-rules.js';
import { concretePath, gatewayEvents, routerRoutes } from './support/routes.js';
import { expiredToken, sessionsForEveryRole } from './support/sessions.js';

const TABLE_FILE = 'service/test/roles-matrix.table.ts';
type Principal = Role | 'no token' | 'expired token';
const PRINCIPALS: Principal[] = [...ROLES, 'no token', 'expired token'];

// Started before the tests are collected: the routes to test are the ones this build serves.
const t = await startTestApp();
const served = routerRoutes(t.app);
const servedKeys = new Set(served.map((r) => r.key));
const events = gatewayEvents(t.app);
const sessions = await sessionsForEveryRole(t.db);
const expired = await expiredToken(sessions.operator.user.id, 'operator');
const chief = sessions.chief_engineer.token;
const engine = await createEngine(t, chief);
const issued = await fetch(`${t.url}/api/loggers`, {
  method: 'POST',
  headers: { 'content-type': 'application/json', ...authHeader(sessions.administrator.token) },
  body: JSON.stringify({ engineId: engine.id, name: 'Roles matrix logger' }),
});
const loggerKey = ((await issued.json()) as { key: string }).key;

afterAll(async () => {
  for (const s of sockets.values()) s.disconnect();
  await t.close();
});

const tokenOf = (p: Principal): string | undefined => (p === 'no token' ? undefined : p === 'expired token' ? expired : sessions[p].token);

async function call(method: string, path: string, headers: Record<string, string>): Promise<{ status: number; text: string }> {
  const hasBody = ['POST', 'PUT', 'PATCH'].includes(method);
  const res = await fetch(`${t.url}${path}`, {
    method,
    headers: { ...(hasBody ? { 'content-type': 'application/json' } : {}), ...headers },
    body: hasBody ? '{}' : undefined,
    redirect: 'manual',
  });
  const text = await res.text();
  return { status: res.status, text: text.slice(0, 200) };
}

/** Routes that end every session of the caller (the session version is raised). */
const SESSION_ENDING = new Set(['POST /api/auth/logout-everywhere']);

const describeAccess = (a: RouteAccess) => (typeof a === 'string' ? a : a.join(', '));

/** What the table expects of one principal on a route. */
function expected(access: RouteAccess, p: Principal): 'allowed' | 401 | 403 {
  if (access === 'public') return 'allowed';
  if (access === 'logger-key') return 401; // no user token opens a logger route
  if (p === 'no token' || p === 'expired token') return 401;
  return access.includes(p) ? 'allowed' : 403;
}

const verdict = (status: number): 'allowed' | 401 | 403 => (status === 401 ? 401 : status === 403 ? 403 : 'allowed');

describe('roles matrix: HTTP routes (router vs test/roles-matrix.table.ts)', () => {
  it('the router serves routes and the table covers every one of them', () => {
    expect(served.length).toBeGreaterThan(30);
    const missing = served.filter((r) => !(r.key in ROUTE_ACCESS)).map((r) => `  '${r.key}': [...roles] | 'public' | 'logger-key',`);
    if (missing.length)
      throw new Error(
        `${missing.length} route(s) have no row in ${TABLE_FILE}. Add, as each controller's @Roles/@AnyRole/@Public ` +
          `says:\n${missing.join('\n')}`,
      );
  });

  it('the table names no route that is not served', () => {
    const stale = Object.keys(ROUTE_ACCESS).filter((k) => !servedKeys.has(k));
    if (stale.length)
      throw new Error(`${TABLE_FILE} has rows for routes the router does not serve (remove or correct them): ${stale.join('; ')}`);
  });

  const keys = [...new Set([...served.map((r) => r.key), ...Object.keys(ROUTE_ACCESS)])].sort();
  it.each(keys)('%s', async (key) => {
    const access = ROUTE_ACCESS[key];
    if (!access)
      throw new Error(`'${key}' is served but has no row in ${TABLE_FILE}; add one: '${key}': [...roles] | 'public' | 'logger-key'`);
    if (!servedKeys.has(key)) throw new Error(`'${key}' is in ${TABLE_FILE} but the router does not serve it; remove or correct the row`);
    const [method, path] = key.split(' ');
    const wrong: string[] = [];
    // A route that ends every session of the caller gets a person of the role of its own, so the shared sessions live on.
    const ownSessions = SESSION_ENDING.has(key) ? await sessionsForEveryRole(t.db) : sessions;
    const answers = await Promise.all(
      PRINCIPALS.map((p) => {
        const token = p === 'no token' || p === 'expired token' ? tokenOf(p) : ownSessions[p].token;
        return call(method, concretePath(path), token ? authHeader(token) : {});
      }),
    );
    PRINCIPALS.forEach((p, i) => {
      const res = answers[i];
      const want = expected(access, p);
      if (res.status >= 500) wrong.push(`${p}: ${res.status} (server error) ${res.text}`);
      else if (verdict(res.status) !== want)
        wrong.push(`${p}: expected ${want === 'allowed' ? 'allowed (not 401/403)' : want}, got ${res.status} ${res.text}`);
    });
    if (access === 'logger-key') {
      const good = await call(method, concretePath(path), { 'x-logger-key': loggerKey });
      if (verdict(good.status) !== 'allowed' || good.status >= 500)
        wrong.push(`a valid logger key: expected allowed, got ${good.status} ${good.text}`);
      const bad = await call(method, concretePath(path), { 'x-logger-key': `cjl_${randomUUID()}` });
      if (bad.status !== 401) wrong.push(`an unknown logger key: expected 401, got ${bad.status} ${bad.text}`);
    }
    if (wrong.length) throw new Error(`${key} (table: ${describeAccess(access)}):\n  ${wrong.join('\n  ')}`);
  });
});

const sockets = new Map<string, Socket>();
async function socketFor(role: Role): Promise<Socket> {
  const hit = sockets.get(role);
  if (hit?.connected) return hit;
  const s = await connected(socketAs(t.url, sessions[role].token));
  sockets.set(role, s);
  return s;
}

/** The connect error a token gets, or null when the live channel lets it in. */
async function connectRefusal(token: string | undefined): Promise<string | null> {
  const s = socketAs(t.url, token);
  try {
    return await new Promise<string | null>((res) => {
      s.once('connect', () => res(null));
      s.once('connect_error', (e: Error) => res(e.message || 'refused'));
    });
  } finally {
    s.disconnect();
  }
}

describe('roles matrix: socket events (gateways vs test/roles-matrix.table.ts)', () => {
  const eventOf = (key: string) => key.split(' ')[0];

  it('every event a gateway subscribes to has a row', () => {
    expect(events).toEqual(expect.arrayContaining(['readings:submit', 'room:join']));
    const covered = new Set(Object.keys(SOCKET_ACCESS).map(eventOf));
    const missing = events.filter((e) => !covered.has(e));
    if (missing.length) throw new Error(`socket event(s) with no row in ${TABLE_FILE} (SOCKET_ACCESS): ${missing.join(', ')}`);
    const stale = [...covered].filter((e) => !events.includes(e));
    if (stale.length) throw new Error(`${TABLE_FILE} has socket rows for events no gateway subscribes to: ${stale.join(', ')}`);
  });

  it('every room rule has a room:join row', () => {
    const samples = Object.entries(SOCKET_ACCESS)
      .filter(([k]) => eventOf(k) === 'room:join')
      .map(([, v]) => (v.payload(randomUUID) as { room: string }).room);
    const uncovered = ROOM_RULES.filter((r) => !samples.some((room) => r.pattern.test(room)));
    if (uncovered.length)
      throw new Error(
        `room rule(s) with no 'room:join <example room>' row in ${TABLE_FILE}: ` +
          `${uncovered.map((r) => `${r.pattern} (${r.what})`).join('; ')}`,
      );
  });

  it.each(['no token', 'expired token'] as const)('the live channel refuses a connection with %s', async (p) => {
    const refusal = await connectRefusal(tokenOf(p));
    expect(refusal).toMatch(/sign/i);
  });

  it.each(Object.keys(SOCKET_ACCESS))('%s', async (key) => {
    const row = SOCKET_ACCESS[key];
    const wrong: string[] = [];
    for (const role of ROLES) {
      const s = await socketFor(role);
      const errors: { status?: number }[] = [];
      const onError = (e: { status?: number }) => errors.push(e);
      s.on('live:error', onError);
      let ack: { ok?: boolean; status?: number; error?: string };
      try {
        ack = await s.timeout(5000).emitWithAck(eventOf(key), row.payload(randomUUID));
      } catch (e) {
        wrong.push(`${role}: no answer (${(e as Error).message})`);
        s.off('live:error', onError);
        continue;
      }
      const want = row.roles.includes(role) ? 'allowed' : 403;
      const denied = ack.ok === false && ack.status === 403;
      if ((ack.status ?? 0) >= 500) wrong.push(`${role}: server error ${JSON.stringify(ack)}`);
      else if (want === 'allowed' && (denied || ack.status === 401)) wrong.push(`${role}: expected allowed, got ${JSON.stringify(ack)}`);
      else if (want === 403 && !denied) wrong.push(`${role}: expected a refusal with status 403, got ${JSON.stringify(ack)}`);
      s.off('live:error', onError);
    }
    if (wrong.length) throw new Error(`${key} (table: ${row.roles.join(', ')}):\n  ${wrong.join('\n  ')}`);
  });
});
