/**
 * Security findings, one test each: every one failed before its fix. Large uploads that must not stall the
 * service, the secrets the scripts write, the start-up refusal of the published development JWT secret.
 */
import { execFile } from 'node:child_process';
import { mkdtempSync, rmSync, statSync } from 'node:fs';
import { request as httpRequest } from 'node:http';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { promisify } from 'node:util';
import pg from 'pg';
import { startTestApp } from '../utils/test-app.js';
import { createEngine, createPreparingRun, engineBody, reading } from '../factories/engine.factory.js';
import { qualifyInDb } from '../factories/checklists.factory.js';
import { StartGateService } from '../../src/modules/runs/start-gate.service.js';
import { smtpTlsOptions } from '../../src/modules/mail/mail.service.js';
import { validateEnvironment } from '../../src/config/env.validation.js';
import { sha256 } from '../../src/common/util/password.util.js';
import { seedUsers } from '../../src/database/seeds/seed-users.js';
import { createUser } from '../factories/users.factory.js';
import { connected, socketAs } from '../utils/socket.js';
import { authHeader } from '../utils/signed-in.js';
import { accessToken, sessionsForEveryRole } from './support/sessions.js';
import { adminUrl, repoRoot, suiteDatabaseUrl } from './support/env.js';

// A small byte cap for this file's app, so a chunked body over it costs a few MB, not 200.
const CAP_BYTES = 3 * 1024 * 1024;
// Low sign-in limits too (every other test file runs with them out of the way), and the docs behind sign-in.
const LIMITS = {
  CSV_IMPORT_MAX_BYTES: String(CAP_BYTES),
  LOGIN_ADDRESS_LIMIT_PER_MINUTE: '8',
  LOGIN_ACCOUNT_LIMIT_PER_HOUR: '6',
  // The API description for signed-in people only (the test suite's default is public).
  API_DOCS: 'signed-in',
};
const before = Object.fromEntries(Object.keys(LIMITS).map((k) => [k, process.env[k]]));
Object.assign(process.env, LIMITS);
const t = await startTestApp();
for (const [k, v] of Object.entries(before))
  if (v === undefined) delete process.env[k];
  else process.env[k] = v;
const s = await sessionsForEveryRole(t.db);
const chief = s.chief_engineer.token;
const operator = s.operator.token;
const engine = await createEngine(t, chief, engineBody());
const run = await createPreparingRun(t, operator, engine.id);

afterAll(() => t.close());

interface Sent {
  status: number;
  body: { message?: unknown };
  ms: number;
}

/** POSTs a CSV body as chunked transfer (no Content-Length), written piece by piece with back-pressure. */
function postChunked(path: string, pieces: () => Iterable<Buffer>): Promise<Sent> {
  const started = performance.now();
  return new Promise((resolve, reject) => {
    const u = new URL(`${t.url}${path}`);
    const req = httpRequest(
      {
        host: u.hostname,
        port: u.port,
        path: u.pathname,
        method: 'POST',
        headers: { 'content-type': 'text/csv', 'transfer-encoding': 'chunked', authorization: `Bearer ${operator}` },
      },
      (res) => {
        let text = '';
        res.setEncoding('utf8');
        res.on('data', (d: string) => (text += d));
        res.on('end', () => {
          let body: Sent['body'] = {};
          try {
            body = JSON.parse(text) as Sent['body'];
          } catch {
            body = { message: text };
          }
          resolve({ status: res.statusCode ?? 0, body, ms: performance.now() - started });
        });
      },
    );
    req.on('error', reject);
    const it = pieces()[Symbol.iterator]();
    const write = () => {
      for (;;) {
        const next = it.next();
        if (next.done) return req.end();
        if (!req.write(next.value)) return req.once('drain', write);
      }
    };
    write();
  });
}

/** Health answers during `work`: the slowest answer, asked every 50 ms. */
async function slowestHealthDuring(work: Promise<unknown>): Promise<number> {
  let done = false;
  let slowest = 0;
  void work.finally(() => (done = true));
  while (!done) {
    const t0 = performance.now();
    await fetch(`${t.url}/api/health`);
    slowest = Math.max(slowest, performance.now() - t0);
    await new Promise((r) => setTimeout(r, 50));
  }
  return slowest;
}

describe('CSV import cannot stall the service', () => {
  it('a body of one 8 MB line is refused with a 400 naming the line, and health stays responsive', async () => {
    const line = Buffer.alloc(64 * 1024, 'x');
    const upload = postChunked(`/api/runs/${run.id}/imports`, function* () {
      yield Buffer.from('taken_at,point,value\n');
      for (let i = 0; i < 128; i++) yield line; // 8 MB, no newline
    });
    const slowest = await slowestHealthDuring(upload);
    const res = await upload;
    expect(res.status).toBe(400);
    expect(String(res.body.message)).toMatch(/^Line 2 is longer than 64 kB/);
    expect(res.ms).toBeLessThan(5000);
    expect(slowest).toBeLessThan(500);
  });

  it('a chunked body (no Content-Length) over the byte cap is refused with 413', async () => {
    const lines = Buffer.from(',,\n'.repeat(40_000)); // 120 kB of empty lines, skipped by the parser
    const res = await postChunked(`/api/runs/${run.id}/imports`, function* () {
      yield Buffer.from('taken_at,point,value\n');
      for (let sent = 0; sent < CAP_BYTES + 2 * lines.length; sent += lines.length) yield lines;
    });
    expect(res.status).toBe(413);
    expect(String(res.body.message)).toMatch(/larger than 3 MB/);
  });

  it('a good file split into many small chunks, lines cut anywhere, is imported whole', async () => {
    const base = Date.now() - 3_600_000;
    const text =
      'taken_at,point,value\n' +
      Array.from({ length: 300 }, (_, i) => `${new Date(base + i * 1000).toISOString()},THR,${100 + (i % 7)}`).join('\n');
    const bytes = Buffer.from(text);
    const res = await postChunked(`/api/runs/${run.id}/imports`, function* () {
      for (let i = 0; i < bytes.length; i += 37) yield bytes.subarray(i, i + 37);
    });
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ stored: 300, rejectedCount: 0 });
  });
});

describe('the published development JWT secret', () => {
  it.each(['development', 'production'])('NODE_ENV=%s without JWT_SECRET refuses to start', (mode) => {
    expect(() => validateEnvironment({ NODE_ENV: mode })).toThrow(/JWT_SECRET is not set/);
    expect(() => validateEnvironment({ NODE_ENV: mode, JWT_SECRET: 'development-only-secret-change-me' })).toThrow(/JWT_SECRET/);
  });

  it('the test suite may use it, and any mode accepts a secret of its own', () => {
    expect(validateEnvironment({ NODE_ENV: 'test' }).JWT_SECRET).toBe('development-only-secret-change-me');
    expect(validateEnvironment({ NODE_ENV: 'development', JWT_SECRET: 'a-secret-of-our-own-1234' }).NODE_ENV).toBe('development');
  });
});

const execFileAsync = promisify(execFile);
const modeOf = (path: string) => (statSync(path).mode & 0o777).toString(8);

describe('the private cluster asks for a password', () => {
  const tryConnect = async (url: string) => {
    const c = new pg.Client({ connectionString: url });
    try {
      await c.connect();
      await c.end();
      return 'connected';
    } catch (e) {
      return (e as Error).message;
    }
  };

  it('the superuser without a password, or with a wrong one, is refused over TCP', async () => {
    const u = new URL(adminUrl());
    u.password = '';
    expect(await tryConnect(u.toString())).toMatch(/password/);
    u.password = 'not-the-password';
    expect(await tryConnect(u.toString())).toMatch(/password authentication failed/);
  });

  it('the service role with the old fixed password is refused; with its generated one it connects', async () => {
    const u = new URL(suiteDatabaseUrl());
    const generated = u.password;
    u.password = 'crankjournal';
    expect(generated).not.toBe('crankjournal');
    expect(await tryConnect(u.toString())).toMatch(/password authentication failed/);
    u.password = generated;
    expect(await tryConnect(u.toString())).toBe('connected');
  });
});

describe('secrets on disk are readable by their owner only', () => {
  it('a secret the scripts generate (the JWT secret) is 0600 and .data/ is not readable by others', async () => {
    const { stdout } = await execFileAsync('bash', ['-c', 'source ops/lib.sh && secret_file jwt-secret'], { cwd: repoRoot() });
    expect(stdout.trim()).toMatch(/^[0-9a-f]{32}$/);
    expect(modeOf(join(repoRoot(), '.data', 'jwt-secret'))).toBe('600');
    // 0711 only as root with a cluster inside (postgres must pass through to its data), else 0700.
    expect(['700', '711']).toContain(modeOf(join(repoRoot(), '.data')));
    for (const f of ['pg-superuser-password', 'pg-crankjournal-password']) expect(modeOf(join(repoRoot(), '.data', f))).toBe('600');
  });

  it('a backup is written 0600 in a 0700 directory', async () => {
    const out = join(mkdtempSync(join(tmpdir(), 'crankjournal-sec-')), 'backups');
    try {
      const { stdout } = await execFileAsync(
        'bash',
        [join(repoRoot(), 'ops', 'backup.sh'), '--database-url', suiteDatabaseUrl(), '--out', out],
        {
          cwd: repoRoot(),
          env: { ...process.env, NODE_OPTIONS: '' },
        },
      );
      const file = stdout.trim().split('\n').pop()!.trim();
      expect(file.endsWith('.dump')).toBe(true);
      expect(modeOf(file)).toBe('600');
      expect(modeOf(out)).toBe('700');
    } finally {
      rmSync(join(out, '..'), { recursive: true, force: true });
    }
  });
});

describe('sessions end everywhere at once', () => {
  const admin = s.administrator.token;
  const me = (token: string) => fetch(`${t.url}/api/auth/me`, { headers: authHeader(token) }).then((r) => r.status);
  /** A connected socket of `token`, and a promise that resolves when the server disconnects it. */
  async function openSocket(token: string) {
    const socket = await connected(socketAs(t.url, token));
    const closed = new Promise<string>((resolve) => socket.once('disconnect', (reason) => resolve(reason)));
    return { socket, closed };
  }
  const within = <T>(p: Promise<T>, ms: number) =>
    Promise.race([p, new Promise<string>((r) => setTimeout(() => r(`still open after ${ms} ms`), ms))]);

  it('a lowered role ends the open socket and the access token at once; the socket cannot start a run on the way out', async () => {
    const u = await createUser(t.db, { role: 'operator' });
    const token = await accessToken(u.id, 'operator');
    const { socket, closed } = await openSocket(token);
    expect(await me(token)).toBe(200);
    const res = await fetch(`${t.url}/api/users/${u.id}`, {
      method: 'PATCH',
      headers: { ...authHeader(admin), 'content-type': 'application/json' },
      body: JSON.stringify({ role: 'observer' }),
    });
    expect(res.status).toBe(200);
    expect(await within(closed, 2000)).toBe('io server disconnect');
    expect(socket.connected).toBe(false);
    expect(await me(token)).toBe(401);
  });

  it('sign-out everywhere ends every access token and socket of the person', async () => {
    const u = await createUser(t.db, { role: 'chief_engineer' });
    const a = await accessToken(u.id, 'chief_engineer');
    const b = await accessToken(u.id, 'chief_engineer');
    const { closed } = await openSocket(b);
    const out = await fetch(`${t.url}/api/auth/logout-everywhere`, { method: 'POST', headers: authHeader(a) });
    expect(out.status).toBe(204);
    expect(await within(closed, 2000)).toBe('io server disconnect');
    expect(await me(a)).toBe(401);
    expect(await me(b)).toBe(401);
    // A new sign-in works (and carries the new session version).
    const login = await fetch(`${t.url}/api/auth/login`, {
      method: 'POST',
      headers: { 'content-type': 'application/json' },
      body: JSON.stringify({ email: u.email, password: u.password }),
    });
    expect(login.status).toBe(200);
    const { accessToken: fresh } = (await login.json()) as { accessToken: string };
    expect(await me(fresh)).toBe(200);
  });

  it('a password change ends the access tokens and sockets of every device', async () => {
    const u = await createUser(t.db, { role: 'operator' });
    const token = await accessToken(u.id, 'operator');
    const other = await accessToken(u.id, 'operator');
    const { closed } = await openSocket(other);
    const res = await fetch(`${t.url}/api/auth/password`, {
      method: 'POST',
      headers: { ...authHeader(token), 'content-type': 'application/json' },
      body: JSON.stringify({ currentPassword: u.password, newPassword: 'a-new-password-of-mine-42' }),
    });
    expect(res.status).toBe(204);
    expect(await within(closed, 2000)).toBe('io server disconnect');
    expect(await me(other)).toBe(401);
  });

  it('a socket event is checked against the role as it is now, not as it was at connection', async () => {
    const u = await createUser(t.db, { role: 'operator' });
    const token = await accessToken(u.id, 'operator');
    const { socket } = await openSocket(token);
    // Lowered straight in the database (no announcement): only the per-event check can see it, once the cache is cleared.
    await t.db.query(`UPDATE users SET role = 'observer' WHERE id = $1`, [u.id]);
    await new Promise((r) => setTimeout(r, 5_100)); // the auth cache keeps an entry at most 5 s
    const ack = (await socket.timeout(3000).emitWithAck('run:start', { runId: run.id })) as { ok: boolean; status?: number };
    expect(ack).toMatchObject({ ok: false, status: 403 });
    socket.disconnect();
  });
});

describe('sign-in limits across e-mails and across addresses', () => {
  const signIn = (email: string, from: string) =>
    fetch(`${t.url}/api/auth/login`, {
      method: 'POST',
      headers: { 'content-type': 'application/json', 'x-forwarded-for': from },
      body: JSON.stringify({ email, password: 'one-common-password' }),
    });

  it('one address trying one password on many accounts is stopped after 8 attempts with 429 and Retry-After', async () => {
    const statuses: number[] = [];
    let last: Response | null = null;
    for (let i = 0; i < 9; i++) {
      last = await signIn(`sprayed-${i}@example.test`, '10.9.8.7');
      statuses.push(last.status);
    }
    expect(statuses.slice(0, 8)).toEqual(Array(8).fill(401));
    expect(statuses[8]).toBe(429);
    expect(Number(last!.headers.get('retry-after'))).toBeGreaterThan(0);
    // Another address is not affected.
    expect((await signIn('sprayed-0@example.test', '10.9.8.8')).status).toBe(401);
  });

  it('one account tried from many addresses is stopped after 6 attempts with 429 and Retry-After', async () => {
    const u = await createUser(t.db, { role: 'observer' });
    const statuses: number[] = [];
    let last: Response | null = null;
    for (let i = 0; i < 7; i++) {
      last = await signIn(u.email, `10.1.2.${i + 1}`);
      statuses.push(last.status);
    }
    expect(statuses.slice(0, 6)).toEqual(Array(6).fill(401));
    expect(statuses[6]).toBe(429);
    expect(Number(last!.headers.get('retry-after'))).toBeGreaterThan(0);
  });
});

describe('demo accounts are seeded once', () => {
  it('a deactivated demo account with a changed password stays so when the seed runs again', async () => {
    const email = 'observer@alderforge.example';
    await t.db.transaction((m) => seedUsers(m));
    const [before] = (await t.db.query(`SELECT id FROM users WHERE email = $1`, [email])) as { id: string }[];
    await t.db.query(`UPDATE users SET active = false, password_hash = 'changed-by-an-administrator' WHERE id = $1`, [before.id]);
    try {
      await t.db.transaction((m) => seedUsers(m));
      const [after] = (await t.db.query(`SELECT active, password_hash FROM users WHERE id = $1`, [before.id])) as {
        active: boolean;
        password_hash: string;
      }[];
      expect(after).toEqual({ active: false, password_hash: 'changed-by-an-administrator' });
    } finally {
      await t.db.query(`DELETE FROM users WHERE id = $1`, [before.id]).catch(() => undefined);
    }
  });
});

describe('deactivated accounts', () => {
  const post = (path: string, body: unknown) =>
    fetch(`${t.url}${path}`, {
      method: 'POST',
      headers: { 'content-type': 'application/json', 'x-forwarded-for': '10.3.3.3' },
      body: JSON.stringify(body),
    });

  it('sign-in of a deactivated account answers the same whether the password is right or not', async () => {
    const u = await createUser(t.db, { role: 'operator', active: false });
    const right = await post('/api/auth/login', { email: u.email, password: u.password });
    const wrong = await post('/api/auth/login', { email: u.email, password: 'surely-not-the-password' });
    expect(right.status).toBe(401);
    expect(wrong.status).toBe(401);
    expect(await right.json()).toEqual(await wrong.json());
  });

  it('an invitation of a person deactivated since cannot be accepted', async () => {
    const u = await createUser(t.db, { role: 'operator', active: false });
    const token = 'invitation-token-of-a-deactivated-person';
    await t.db.query(`INSERT INTO invitations (user_id, token_hash, expires_at) VALUES ($1, $2, now() + interval '1 day')`, [
      u.id,
      sha256(token),
    ]);
    const res = await post('/api/auth/accept-invitation', { token, password: 'a-password-of-my-own-1' });
    expect(res.status).toBe(400);
    expect(((await res.json()) as { message: string }).message).toMatch(/not active/);
  });
});

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));
/** A JSON request with a token, answered as { status, body }. */
async function send(method: string, path: string, token: string, body?: unknown) {
  const res = await fetch(`${t.url}${path}`, {
    method,
    headers: { ...authHeader(token), ...(body === undefined ? {} : { 'content-type': 'application/json' }) },
    body: body === undefined ? undefined : JSON.stringify(body),
  });
  const text = await res.text();
  return { status: res.status, body: (text ? JSON.parse(text) : null) as Record<string, unknown> & { message?: unknown } };
}

/** A cleared run of a fresh engine the chief engineer may start; the engine's points by code. */
async function clearedRun() {
  const e = await createEngine(t, chief, engineBody());
  await qualifyInDb(t, s.chief_engineer.user.id, e.id, ['start_and_run']);
  const r = await createPreparingRun(t, chief, e.id);
  const cleared = await send('POST', `/api/runs/${r.id}/transitions`, chief, { to: 'cleared' });
  if (cleared.status !== 200) throw new Error(`not cleared: ${cleared.status} ${JSON.stringify(cleared.body)}`);
  const point = (code: string) => e.measurementPoints.find((p) => p.code === code)!.id;
  return { engine: e, run: r, point };
}

describe('the start gate and the start itself are one transaction', () => {
  it('a high-high reading that arrives while the gate is being asked waits for the start; it cannot slip in between', async () => {
    const { run: r, point } = await clearedRun();
    // A slow rule of this run only: the gate takes 800 ms to decide, and notes the high-high alarms there are then.
    let highHighWhenDecided = -1;
    t.app.get(StartGateService).registerStartRule({
      name: 'test: a slow rule',
      check: async (checked) => {
        if (checked.id !== r.id) return { reasons: [] };
        await sleep(800);
        const [{ n }] = (await t.db.query(`SELECT count(*)::int AS n FROM alarms WHERE run_id = $1 AND priority = 'high_high'`, [
          r.id,
        ])) as { n: number }[];
        highHighWhenDecided = n;
        return { reasons: [] };
      },
    });
    const start = send('POST', `/api/runs/${r.id}/transitions`, chief, { to: 'running' });
    await sleep(200);
    const round = send('POST', `/api/runs/${r.id}/rounds`, chief, {
      takenAt: new Date().toISOString(),
      readings: [reading(point('THR'), 149)],
    });
    const [started, stored] = await Promise.all([start, round]);
    expect(started.status).toBe(200);
    // Before, the reading was stored and its alarm raised while the gate was deciding, and the run started anyway.
    expect(highHighWhenDecided).toBe(0);
    expect(stored.status).toBe(201);
    expect(stored.body).toMatchObject({ stored: 1, alarmsRaised: 1 });
  });
});

describe('a back-dated reading does not reopen the start gate; a high-high alarm waits for a person', () => {
  it('an older normal reading clears nothing, and a cleared high-high alarm holds the gate until acknowledged', async () => {
    const { run: r, point } = await clearedRun();
    const now = Date.now();
    const round = (value: number, at: number) =>
      send('POST', `/api/runs/${r.id}/rounds`, chief, {
        takenAt: new Date(at).toISOString(),
        readings: [reading(point('THR'), value, new Date(at))],
      });
    const start = () => send('POST', `/api/runs/${r.id}/transitions`, chief, { to: 'running' });
    const highHigh = async () =>
      (
        (await t.db.query(`SELECT id, state, condition_active FROM alarms WHERE run_id = $1 AND priority = 'high_high'`, [r.id])) as {
          id: string;
          state: string;
          condition_active: boolean;
        }[]
      )[0];

    expect((await round(149, now - 60_000)).body).toMatchObject({ stored: 1, alarmsRaised: 1 });
    expect((await start()).status).toBe(409);
    // A normal value stamped before the alarm's reading (a tablet's late round, or a forged time).
    expect((await round(120, now - 90_000)).status).toBe(201);
    expect(await highHigh()).toMatchObject({ state: 'active_unacknowledged', condition_active: true });
    expect((await start()).status).toBe(409);
    // A normal value after it: the condition is gone, but nobody has acknowledged the alarm yet.
    expect((await round(120, now - 30_000)).status).toBe(201);
    const hh = await highHigh();
    expect(hh).toMatchObject({ state: 'returned_unacknowledged', condition_active: false });
    const refused = await start();
    expect(refused.status).toBe(409);
    expect(String(refused.body.message)).toMatch(/nobody has acknowledged it/);
    expect((await send('POST', `/api/alarms/${hh.id}/acknowledge`, chief, {})).status).toBe(200);
    expect((await start()).status).toBe(200);
  });
});

describe('client ids are scoped to their run', () => {
  it('the same client id in another run is another reading; in the same run with other content it is a 409', async () => {
    const other = await clearedRun();
    const thr = engine.measurementPoints.find((p) => p.code === 'THR')!.id;
    const takenAt = new Date(Date.now() - 120_000);
    const mine = reading(thr, 120, takenAt);
    const round = (runId: string, r: ReturnType<typeof reading>) =>
      send('POST', `/api/runs/${runId}/rounds`, operator, { takenAt: r.takenAt, readings: [r] });
    expect((await round(run.id, mine)).body).toMatchObject({ stored: 1, duplicates: 0 });
    // Another run (of another engine) using the same id: before, it was dropped as a duplicate of this run's reading.
    const elsewhere = await send('POST', `/api/runs/${other.run.id}/rounds`, chief, {
      takenAt: mine.takenAt,
      readings: [{ ...mine, pointId: other.point('THR') }],
    });
    expect(elsewhere.body).toMatchObject({ stored: 1, duplicates: 0 });
    // The same id in the same run with another value: a conflict, not a duplicate.
    const clash = await round(run.id, { ...mine, value: 121 });
    expect(clash.status).toBe(409);
    expect(String(clash.body.message)).toMatch(new RegExp(`clientId ${mine.clientId} was already used in this run`));
    // A true resend still counts once.
    expect((await round(run.id, mine)).body).toMatchObject({ stored: 0, duplicates: 1 });
    const [{ n }] = (await t.db.query(`SELECT count(*)::int AS n FROM readings WHERE client_id = $1`, [mine.clientId])) as { n: number }[];
    expect(n).toBe(2);
  });
});

describe('password and PIN oracles have an attempt limit', () => {
  it('after 5 wrong passwords or PINs, re-entry, PIN setting and signing all answer 429 with Retry-After, the right one too', async () => {
    const u = await createUser(t.db, { role: 'chief_engineer' });
    const token = await accessToken(u.id, 'chief_engineer');
    // A stopped run to countersign.
    const e = await createEngine(t, chief, engineBody());
    const r = await createPreparingRun(t, chief, e.id);
    await t.db.query(`UPDATE runs SET state = 'stopped', started_at = now() - interval '1 hour', stopped_at = now() WHERE id = $1`, [r.id]);
    const changePassword = (currentPassword: string) =>
      send('POST', '/api/auth/password', token, { currentPassword, newPassword: 'a-new-password-of-mine-42' });
    const setPin = (currentPassword: string) => send('POST', '/api/auth/signing-pin', token, { currentPassword, pin: '482913' });
    const countersign = (signature: string) => send('POST', `/api/runs/${r.id}/transitions`, token, { to: 'closed', signature });

    expect((await changePassword('guess-1')).status).toBe(400);
    expect((await changePassword('guess-2')).status).toBe(400);
    expect((await setPin('guess-3')).status).toBe(400);
    expect((await setPin('guess-4')).status).toBe(400);
    expect((await countersign('1234')).status).toBe(400);
    // Locked now: the right password is refused too, with the time to wait.
    for (const attempt of [() => setPin(u.password), () => countersign(u.password), () => changePassword(u.password)]) {
      const res = await fetch(`${t.url}/api/auth/me`, { headers: authHeader(token) });
      expect(res.status).toBe(200);
      const refused = await attempt();
      expect(refused.status).toBe(429);
      expect(String(refused.body.message)).toMatch(/Too many wrong passwords or PINs/);
    }
    const raw = await fetch(`${t.url}/api/auth/signing-pin`, {
      method: 'POST',
      headers: { ...authHeader(token), 'content-type': 'application/json' },
      body: JSON.stringify({ currentPassword: u.password, pin: '482913' }),
    });
    expect(raw.status).toBe(429);
    expect(Number(raw.headers.get('retry-after'))).toBeGreaterThan(60);
    // Someone else is not affected.
    expect(
      (await send('POST', '/api/auth/signing-pin', chief, { currentPassword: s.chief_engineer.user.password, pin: '482913' })).status,
    ).toBe(204);
  });
});

describe('the refresh token lives in an httpOnly cookie', () => {
  const login = (email: string, password: string, headers: Record<string, string> = {}) =>
    fetch(`${t.url}/api/auth/login`, {
      method: 'POST',
      headers: { 'content-type': 'application/json', 'x-forwarded-for': '10.5.5.5', ...headers },
      body: JSON.stringify({ email, password }),
    });
  const cookieOf = (res: Response) => res.headers.getSetCookie().find((c) => c.startsWith('cj_refresh='));

  it('sign-in sets it httpOnly, SameSite=Strict, for /api/auth only, not in the body; refresh works from it alone', async () => {
    const u = await createUser(t.db, { role: 'operator' });
    const res = await login(u.email, u.password);
    expect(res.status).toBe(200);
    const body = (await res.json()) as Record<string, unknown>;
    expect(body.refreshToken).toBeUndefined();
    const cookie = cookieOf(res)!;
    expect(cookie).toMatch(/^cj_refresh=[0-9a-f-]{36}\.[^;]+; Path=\/api\/auth; Expires=[^;]+; HttpOnly; SameSite=Strict$/);
    // No cookie, no refresh; with it, a new access token and a rotated cookie.
    expect((await fetch(`${t.url}/api/auth/refresh`, { method: 'POST' })).status).toBe(400);
    const pair = cookie.split(';')[0];
    const refreshed = await fetch(`${t.url}/api/auth/refresh`, { method: 'POST', headers: { cookie: pair } });
    expect(refreshed.status).toBe(200);
    expect(((await refreshed.json()) as Record<string, unknown>).accessToken).toEqual(expect.any(String));
    const next = cookieOf(refreshed)!;
    expect(next.split(';')[0]).not.toBe(pair);
    // The family keeps the end of its sign-in: rotation does not stretch it.
    expect(next.match(/Expires=([^;]+)/)![1]).toBe(cookie.match(/Expires=([^;]+)/)![1]);
  });

  it('behind a TLS proxy (X-Forwarded-Proto: https) the cookie is Secure too', async () => {
    const u = await createUser(t.db, { role: 'observer' });
    const res = await login(u.email, u.password, { 'x-forwarded-proto': 'https', 'x-forwarded-for': '10.5.5.6' });
    expect(res.status).toBe(200);
    expect(cookieOf(res)).toMatch(/; Secure; SameSite=Strict$/);
  });
});

describe('display names are unique and records keep the name as signed', () => {
  it('an active person cannot take a colleague’s name, whatever the case', async () => {
    const a = await createUser(t.db, { role: 'operator', displayName: `Wren Halloway ${Date.now()}` });
    const b = await createUser(t.db, { role: 'operator' });
    const token = await accessToken(b.id, 'operator');
    const taken = await send('PATCH', '/api/auth/me', token, { displayName: a.displayName.toUpperCase() });
    expect(taken.status).toBe(409);
    expect(String(taken.body.message)).toMatch(/already called/);
    const byAdmin = await send('PATCH', `/api/users/${b.id}`, s.administrator.token, { displayName: a.displayName });
    expect(byAdmin.status).toBe(409);
    expect((await send('PATCH', '/api/auth/me', token, { displayName: `${a.displayName} junior` })).status).toBe(200);
  });

  it('a countersigned run shows the name as it was when signed, after the signer is renamed', async () => {
    const u = await createUser(t.db, { role: 'chief_engineer', displayName: `Ottilie Brame ${Date.now()}` });
    const token = await accessToken(u.id, 'chief_engineer');
    const e = await createEngine(t, chief, engineBody());
    const r = await createPreparingRun(t, chief, e.id);
    await t.db.query(`UPDATE runs SET state = 'stopped', started_at = now() - interval '1 hour', stopped_at = now() WHERE id = $1`, [r.id]);
    const closed = await send('POST', `/api/runs/${r.id}/transitions`, token, { to: 'closed', signature: u.password });
    expect(closed.status).toBe(200);
    expect((await send('PATCH', '/api/auth/me', token, { displayName: `Someone Else ${Date.now()}` })).status).toBe(200);
    const after = await send('GET', `/api/runs/${r.id}`, chief);
    expect(after.body.countersignedByName).toBe(u.displayName);
  });
});

describe('engine parts belong to their engine and are retired, not deleted', () => {
  /** The engine's description as it stands, for a PUT (ids kept). */
  const bodyOf = (e: Awaited<ReturnType<typeof createEngine>>) => {
    const base = engineBody(e.name);
    return {
      ...base,
      cylinders: e.cylinders.map(({ id, label, role, boreIn, strokeIn, pistonRodIn, tailRodIn, clearancePercent }) => ({
        id,
        label,
        role,
        boreIn,
        strokeIn,
        pistonRodIn,
        tailRodIn,
        clearancePercent,
      })),
      lubricationPoints: e.lubricationPoints.map(({ id, label, kind, oilGrade }) => ({ id, label, kind, oilGrade })),
      bearings: e.bearings.map(({ id, label, kind, journalDiameterIn, journalLengthIn, loadSharePercent, lubricationPointId }) => ({
        id,
        label,
        kind,
        journalDiameterIn,
        journalLengthIn,
        loadSharePercent,
        lubricationPointId,
      })),
      measurementPoints: base.measurementPoints.map((p) => {
        const { bearingLabel: _b, ...rest } = p;
        void _b;
        const own = e.measurementPoints.find((x) => x.code === p.code)!;
        return { ...rest, id: own.id, ...(own.bearingId ? { bearingId: own.bearingId } : {}) };
      }),
    };
  };

  it('a point or bearing that names a part of another engine is refused with 400', async () => {
    const mine = await createEngine(t, chief, engineBody());
    const theirs = await createEngine(t, chief, engineBody());
    const body = bodyOf(mine);
    body.measurementPoints.find((p) => p.code === 'MB')!.bearingId = theirs.bearings[0].id;
    const res = await send('PUT', `/api/engines/${mine.id}`, chief, body);
    expect(res.status).toBe(400);
    expect(String(res.body.message)).toMatch(/is not one of this engine's bearings/);
    const lube = bodyOf(mine);
    lube.bearings[0].lubricationPointId = theirs.lubricationPoints[0].id;
    expect((await send('PUT', `/api/engines/${mine.id}`, chief, lube)).status).toBe(400);
  });

  it('a bearing left out of the description is retired: gone from the engine, still in the database', async () => {
    const e = await createEngine(t, chief, engineBody());
    const bearingId = e.bearings[0].id;
    const body = bodyOf(e);
    body.bearings = [];
    body.measurementPoints = body.measurementPoints.map((p) => ({ ...p, bearingId: undefined }));
    const res = await send('PUT', `/api/engines/${e.id}`, chief, body);
    expect(res.status).toBe(200);
    expect(res.body.bearings).toEqual([]);
    const rows = (await t.db.query(`SELECT active FROM bearings WHERE id = $1`, [bearingId])) as { active: boolean }[];
    expect(rows).toEqual([{ active: false }]);
  });
});

describe('transport security headers, the API description and mail over TLS', () => {
  it('HSTS is sent on answers to HTTPS requests (through a trusted proxy), never over plain HTTP', async () => {
    const over = await fetch(`${t.url}/api/health`, { headers: { 'x-forwarded-proto': 'https' } });
    expect(over.headers.get('strict-transport-security')).toBe('max-age=15552000; includeSubDomains');
    const plain = await fetch(`${t.url}/api/health`);
    expect(plain.headers.get('strict-transport-security')).toBeNull();
  });

  it('the CSP lets the page connect to its own origin only', async () => {
    const csp = (await fetch(`${t.url}/api/health`)).headers.get('content-security-policy') ?? '';
    expect(csp).toMatch(/(^|;)connect-src 'self'(;|$)/);
  });

  it('with API_DOCS=signed-in the description needs an access token; production hides it unless asked', async () => {
    expect((await fetch(`${t.url}/api/docs-json`)).status).toBe(401);
    expect((await fetch(`${t.url}/api/docs`)).status).toBe(401);
    const res = await fetch(`${t.url}/api/docs-json`, { headers: authHeader(s.observer.token) });
    expect(res.status).toBe(200);
    expect(((await res.json()) as { openapi?: string }).openapi).toMatch(/^3\./);
    // A production start also needs the payment service's own keys (the stand-in's are refused).
    const secret = {
      JWT_SECRET: 'a-secret-of-our-own-1234',
      PAYMENTS_API_KEY: 'sk_test_a-key-of-our-own',
      PAYMENTS_WEBHOOK_SECRET: 'whsec_a-secret-of-our-own',
    };
    expect(validateEnvironment({ NODE_ENV: 'production', ...secret }).API_DOCS).toBe('off');
    expect(validateEnvironment({ NODE_ENV: 'development', ...secret }).API_DOCS).toBe('public');
    expect(validateEnvironment({ NODE_ENV: 'production', API_DOCS: 'signed-in', ...secret }).API_DOCS).toBe('signed-in');
  });

  it('mail goes over TLS when asked (SMTP_SECURE, SMTP_REQUIRE_TLS) and plain only to a server on this machine', () => {
    const env = validateEnvironment({ NODE_ENV: 'test', SMTP_SECURE: 'true', SMTP_REQUIRE_TLS: '1' });
    expect([env.SMTP_SECURE, env.SMTP_REQUIRE_TLS]).toEqual([true, true]);
    expect(smtpTlsOptions({ host: '127.0.0.1', secure: false, requireTls: false })).toMatchObject({ ignoreTLS: true, requireTLS: false });
    // A remote server: STARTTLS whenever it is offered, required when asked, or TLS from the first byte.
    expect(smtpTlsOptions({ host: 'mail.example.test', secure: false, requireTls: false })).toMatchObject({
      secure: false,
      ignoreTLS: false,
      requireTLS: false,
    });
    expect(smtpTlsOptions({ host: 'mail.example.test', secure: false, requireTls: true })).toMatchObject({
      ignoreTLS: false,
      requireTLS: true,
    });
    expect(smtpTlsOptions({ host: 'mail.example.test', secure: true, requireTls: false })).toMatchObject({
      secure: true,
      ignoreTLS: false,
    });
  });
});
