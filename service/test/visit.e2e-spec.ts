import { randomUUID } from 'node:crypto';
import { io, type Socket } from 'socket.io-client';
import type { CardSetDto, EngineDetail, RunDetail, VisitorBoardDto, VisitorBoardView, VisitorFigures } from '@crankjournal/shared-types';
import { horsesFromHorsepower, smallCarEnginesFromHorsepower } from '../src/calculations/visitor-figures.js';
import { startTestApp, type TestApp } from './utils/test-app.js';
import { connected } from './utils/socket.js';
import { requestAs, signedIn } from './utils/signed-in.js';
import { login, type SignedIn } from './factories/users.factory.js';
import { createEngine, createPreparingRun, reading } from './factories/engine.factory.js';

/** The smallest valid PNG file: signature, IHDR (1×1, 8-bit grey), IDAT, IEND. */
const PNG_1x1 = Buffer.from(
  '89504e470d0a1a0a0000000d4948445200000001000000010800000000376ef9240000000a49444154789c63600000000200014815b4a40000000049454e44ae426082',
  'hex',
);

/** This file's own limits (restored afterwards: other files share the process). */
const ENV = { VISIT_DELAY_SECONDS: '3', VISIT_RATE_LIMIT_PER_MINUTE: '80', VISIT_VIEWERS_PER_BOARD: '3' };
const WAIT_MS = 8_000;

/** Every key a visitor may ever see; anything else (a name, an alarm, a limit…) fails the test. */
const VIEW_KEYS = ['slug', 'engineName', 'title', 'story', 'photoPath', 'figures'];
const FIGURE_KEYS = [
  'state',
  'speedRpm',
  'revolutionsSinceStart',
  'steamPressurePsig',
  'steamPressureBar',
  'indicatedHorsepower',
  'indicatedKilowatts',
  'horses',
  'smallCarEngines',
  'delaySeconds',
  'at',
];
function expectOnlyAllowed(view: VisitorBoardView) {
  expect(Object.keys(view).sort()).toEqual([...VIEW_KEYS].sort());
  expectOnlyAllowedFigures(view.figures);
  for (const k of ['slug', 'engineName', 'title', 'story'] as const) expect(typeof view[k]).toBe('string');
}
function expectOnlyAllowedFigures(f: VisitorFigures) {
  expect(Object.keys(f).sort()).toEqual([...FIGURE_KEYS].sort());
  for (const k of FIGURE_KEYS) if (k !== 'state' && k !== 'at') expect(['number', 'object']).toContain(typeof f[k as keyof VisitorFigures]);
}

function visitor(url: string, slug: string): Socket {
  return io(`${url}/visit`, { transports: ['websocket'], reconnection: false, forceNew: true, autoConnect: false, auth: { slug } });
}

/** The next `visit:figures` for which `ok` holds, or a rejection after WAIT_MS. */
function figuresWhere(s: Socket, ok: (f: VisitorFigures) => boolean): Promise<VisitorFigures> {
  return new Promise((resolve, reject) => {
    const timer = setTimeout(() => {
      s.off('visit:figures', on);
      reject(new Error(`no matching visit:figures within ${WAIT_MS} ms`));
    }, WAIT_MS);
    const on = (f: VisitorFigures) => {
      if (!ok(f)) return;
      clearTimeout(timer);
      s.off('visit:figures', on);
      resolve(f);
    };
    s.on('visit:figures', on);
  });
}

describe('visitor boards', () => {
  let t: TestApp;
  let chief: SignedIn;
  let operator: SignedIn;
  let observer: SignedIn;
  let engine: EngineDetail;
  let run: RunDetail;
  const saved: Record<string, string | undefined> = {};
  const sockets: Socket[] = [];
  const point = (code: string) => engine.measurementPoints.find((p) => p.code === code)!.id;
  const track = (s: Socket) => (sockets.push(s), s);

  beforeAll(async () => {
    for (const [k, v] of Object.entries(ENV)) {
      saved[k] = process.env[k];
      process.env[k] = v;
    }
    t = await startTestApp();
    chief = await login(t, 'chief_engineer', { displayName: `Chief Visible-Name ${randomUUID().slice(0, 8)}` });
    operator = await login(t, 'operator', { displayName: `Operator Visible-Name ${randomUUID().slice(0, 8)}` });
    observer = await login(t, 'observer');
    engine = await createEngine(t, chief);
    run = await createPreparingRun(t, chief, engine.id, { title: 'Open day test run' });
  });
  afterEach(() => {
    for (const s of sockets.splice(0)) s.disconnect();
  });
  afterAll(async () => {
    await t?.close();
    for (const [k, v] of Object.entries(saved)) {
      if (v === undefined) delete process.env[k];
      else process.env[k] = v;
    }
  });

  let board: VisitorBoardDto;

  it('only the chief engineer manages boards; other roles get 403 and no token 401', async () => {
    for (const who of [operator, observer]) {
      expect((await signedIn(t, who).get('/api/visitor-boards')).status).toBe(403);
      expect((await signedIn(t, who).post('/api/visitor-boards').send({ runId: run.id })).status).toBe(403);
    }
    expect((await requestAs(t, undefined).get('/api/visitor-boards')).status).toBe(401);
    const res = await signedIn(t, chief).post('/api/visitor-boards').send({ runId: run.id });
    expect(res.status).toBe(201);
    board = res.body as VisitorBoardDto;
    expect(board).toMatchObject({ scope: 'run', runId: run.id, engineId: engine.id, enabled: true, followsLabel: 'Open day test run' });
    expect(board.slug).toMatch(/^[A-Za-z0-9_-]{24}$/);
    expect(board.path).toBe(`/visit/${board.slug}`);
    expect((await signedIn(t, chief).post('/api/visitor-boards').send({ runId: run.id })).status).toBe(409);
    const both = await signedIn(t, chief).post('/api/visitor-boards').send({ runId: run.id, engineId: engine.id });
    expect(both.status).toBe(400);
    expect((await signedIn(t, operator).patch(`/api/visitor-boards/${board.id}`).send({ enabled: false })).status).toBe(403);
    expect((await signedIn(t, operator).post(`/api/visitor-boards/${board.id}/slug`)).status).toBe(403);
  });

  it('a board that is on answers without sign-in with allow-listed figures only; the engine rests before the start', async () => {
    const story = 'Built in 1900, this engine drove the rolling mill for sixty years.';
    expect((await signedIn(t, chief).patch(`/api/visitor-boards/${board.id}`).send({ story })).status).toBe(200);
    const res = await requestAs(t, undefined).get(`/api/visit/${board.slug}`);
    expect(res.status).toBe(200);
    const view = res.body as VisitorBoardView;
    expectOnlyAllowed(view);
    expect(view).toMatchObject({ title: 'Open day test run', engineName: engine.name, story, photoPath: null });
    expect(view.figures).toMatchObject({ state: 'resting', speedRpm: null, steamPressurePsig: null, delaySeconds: 3 });
    const text = JSON.stringify(res.body);
    expect(text).not.toMatch(/Visible-Name|alarm|limit|checklist|crew/i);
  });

  it('readings show after the delay, smoothed; an alarm makes the engine rest without any detail', async () => {
    await t.db.query(`UPDATE runs SET state = 'running', started_at = now() - interval '10 minutes' WHERE id = $1`, [run.id]);
    const s = track(visitor(t.url, board.slug));
    await connected(s);
    const now = Date.now();
    const sent = await signedIn(t, operator)
      .post(`/api/runs/${run.id}/rounds`)
      .send({
        takenAt: new Date(now).toISOString(),
        readings: [
          reading(point('SPD'), 72, new Date(now - 10_000)),
          reading(point('SPD'), 74, new Date(now)),
          reading(point('THR'), 128, new Date(now - 5_000)),
          reading(point('THR'), 132, new Date(now)),
        ],
      });
    expect(sent.status).toBe(201);
    // Delayed: readings that arrived less than VISIT_DELAY_SECONDS ago are not shown yet.
    const early = ((await requestAs(t, undefined).get(`/api/visit/${board.slug}`)).body as VisitorBoardView).figures;
    expect(early).toMatchObject({ state: 'working', speedRpm: null, steamPressurePsig: null });
    // Smoothed: the mean of the readings within 15 s of the newest (73 rpm, 130 psig).
    const f = await figuresWhere(s, (x) => x.state === 'working' && x.speedRpm !== null);
    expectOnlyAllowedFigures(f);
    expect(f.speedRpm).toBeCloseTo(73, 6);
    expect(f.steamPressurePsig).toBe(130);
    // 130 psi × 6.894757 kPa/psi = 896.3 kPa = 8.96 bar (NIST SP 811, 2008, appendix B.8)
    expect(f.steamPressureBar).toBeCloseTo(9.0, 6);
    // Ten minutes at 72–74 rpm since the start (held before the first reading): about 730 revolutions.
    expect(f.revolutionsSinceStart).toBeGreaterThan(700);
    expect(f.revolutionsSinceStart).toBeLessThan(760);

    const hot = await signedIn(t, operator)
      .post(`/api/runs/${run.id}/rounds`)
      .send({ takenAt: new Date().toISOString(), readings: [reading(point('MB'), 150)] });
    expect(hot.status).toBe(201);
    const resting = await figuresWhere(s, (x) => x.state === 'resting');
    expect(resting).toMatchObject({ speedRpm: null, steamPressurePsig: null, revolutionsSinceStart: null });
    const view = (await requestAs(t, undefined).get(`/api/visit/${board.slug}`)).body as VisitorBoardView;
    expectOnlyAllowed(view);
    expect(view.figures.state).toBe('resting');
    expect(JSON.stringify(view)).not.toMatch(/alarm|bearing|Main bearing|high/i);
    await t.db.query(`UPDATE alarms SET state = 'normal' WHERE run_id = $1`, [run.id]);
  });

  it('the latest indicated horsepower comes from the card sets, with its everyday equivalents', async () => {
    const cyl = engine.cylinders[0].id;
    const res = await signedIn(t, operator)
      .post(`/api/runs/${run.id}/card-sets`)
      .send({
        takenAt: new Date().toISOString(),
        cards: [
          { cylinderId: cyl, end: 'head', meanEffectivePressurePsi: 40 },
          { cylinderId: cyl, end: 'crank', meanEffectivePressurePsi: 38 },
        ],
      });
    expect(res.status).toBe(201);
    const hp = (res.body as CardSetDto).results.totalIndicatedHorsepower;
    expect(hp).toBeGreaterThan(0);
    const f = ((await requestAs(t, undefined).get(`/api/visit/${board.slug}`)).body as VisitorBoardView).figures;
    expect(f.indicatedHorsepower).toBeCloseTo(hp, 1);
    expect(f.horses).toBe(Math.round(horsesFromHorsepower(hp)));
    expect(f.smallCarEngines).toBeCloseTo(smallCarEnginesFromHorsepower(hp), 1);
  });

  it('the story photo goes through the storage and is served publicly; a non-image is refused with 415', async () => {
    const png = PNG_1x1;
    const up = await signedIn(t, chief).put(`/api/visitor-boards/${board.id}/photo`).set('content-type', 'image/png').send(png);
    expect(up.status).toBe(200);
    expect((up.body as VisitorBoardDto).hasPhoto).toBe(true);
    const bad = await signedIn(t, chief)
      .put(`/api/visitor-boards/${board.id}/photo`)
      .set('content-type', 'image/png')
      .send(Buffer.from('not an image'));
    expect(bad.status).toBe(415);
    const view = (await requestAs(t, undefined).get(`/api/visit/${board.slug}`)).body as VisitorBoardView;
    expect(view.photoPath).toBe(`/api/visit/${board.slug}/photo`);
    const photo = await requestAs(t, undefined).get(view.photoPath!);
    expect(photo.status).toBe(200);
    expect(photo.headers['content-type']).toBe('image/png');
    expect(Buffer.compare(photo.body as Buffer, png)).toBe(0);
  });

  it('the public namespace refuses every crew event and has none of the crew rooms', async () => {
    const s = track(visitor(t.url, board.slug));
    await connected(s);
    const crewEvents: [string, unknown][] = [
      ['readings:submit', { runId: run.id, readings: [reading(point('SPD'), 10)] }],
      ['run:start', { runId: run.id }],
      ['room:join', { room: `run:${run.id}` }],
      ['room:join', { room: 'site' }],
      ['room:leave', { room: 'site' }],
    ];
    for (const [event, payload] of crewEvents) {
      const ack = (await s.timeout(WAIT_MS).emitWithAck(event, payload)) as { ok: boolean; status: number };
      expect(ack).toMatchObject({ ok: false, status: 405 });
    }
    // Nothing of the crew's channel reaches a visitor: a site notice goes out, the visitor hears nothing of it.
    const heard: string[] = [];
    s.onAny((e: string) => heard.push(e));
    expect((await signedIn(t, chief).post('/api/live/notices').send({ message: 'Crew only notice' })).status).toBe(202);
    const readingsBefore = (await t.db.query(`SELECT count(*)::int AS n FROM readings WHERE run_id = $1`, [run.id]))[0].n;
    await new Promise((r) => setTimeout(r, 2_500));
    expect(heard.filter((e) => e !== 'visit:figures')).toEqual([]);
    expect((await t.db.query(`SELECT count(*)::int AS n FROM readings WHERE run_id = $1`, [run.id]))[0].n).toBe(readingsBefore);
    // A crew token is no key to the visitor namespace, nor a slug to the crew's.
    const crewish = track(
      io(`${t.url}/visit`, { transports: ['websocket'], reconnection: false, forceNew: true, auth: { token: chief.accessToken } }),
    );
    await expect(connected(crewish)).rejects.toThrow(/no visitor board/i);
    const slugOnCrew = track(io(t.url, { transports: ['websocket'], reconnection: false, forceNew: true, auth: { slug: board.slug } }));
    await expect(connected(slugOnCrew)).rejects.toThrow(/access token/i);
    // No write route exists under /api/visit.
    for (const method of ['post', 'put', 'patch', 'delete'] as const)
      expect([404, 405]).toContain((await requestAs(t, undefined)[method](`/api/visit/${board.slug}`)).status);
  });

  it('caps the visitors of one board', async () => {
    for (let i = 0; i < 3; i++) await connected(track(visitor(t.url, board.slug)));
    await expect(connected(track(visitor(t.url, board.slug)))).rejects.toThrow(/as many visitors/i);
  });

  it('a new address ends the old one at once, and switching off answers 404 and ends the visitors', async () => {
    const s = track(visitor(t.url, board.slug));
    await connected(s);
    const ended = new Promise<{ message: string }>((resolve) => s.once('visit:ended', resolve));
    const moved = await signedIn(t, chief).post(`/api/visitor-boards/${board.id}/slug`);
    expect(moved.status).toBe(200);
    const next = moved.body as VisitorBoardDto;
    expect(next.slug).not.toBe(board.slug);
    expect((await ended).message).toMatch(/switched off|new address/);
    expect((await requestAs(t, undefined).get(`/api/visit/${board.slug}`)).status).toBe(404);
    expect((await requestAs(t, undefined).get(`/api/visit/${next.slug}`)).status).toBe(200);
    await expect(connected(track(visitor(t.url, board.slug)))).rejects.toThrow(/no visitor board/i);

    const s2 = track(visitor(t.url, next.slug));
    await connected(s2);
    const gone = new Promise<string>((resolve) => s2.once('disconnect', resolve));
    expect((await signedIn(t, chief).patch(`/api/visitor-boards/${board.id}`).send({ enabled: false })).status).toBe(200);
    expect(await gone).toBe('io server disconnect');
    const off = await requestAs(t, undefined).get(`/api/visit/${next.slug}`);
    expect(off.status).toBe(404);
    expect(off.body.message).toMatch(/switched off/);
    expect((await requestAs(t, undefined).get(`/api/visit/${next.slug}/photo`)).status).toBe(404);
    expect((await requestAs(t, undefined).get(`/api/visit/${randomUUID()}`)).status).toBe(404);
    expect((await requestAs(t, undefined).get('/api/visit/a')).status).toBe(400);
    board = next;
  });

  it('an engine board follows whichever run is under way', async () => {
    const res = await signedIn(t, chief).post('/api/visitor-boards').send({ engineId: engine.id });
    expect(res.status).toBe(201);
    const b = res.body as VisitorBoardDto;
    expect(b).toMatchObject({ scope: 'engine', runId: null, followsLabel: engine.name });
    const view = (await requestAs(t, undefined).get(`/api/visit/${b.slug}`)).body as VisitorBoardView;
    expectOnlyAllowed(view);
    expect(view.title).toBe(engine.name);
    expect(view.figures.state).toBe('working');
  });

  it('the public routes answer 429 with Retry-After past their own limit (sign-in is not affected)', async () => {
    let last = 0;
    let retryAfter: string | undefined;
    for (let i = 0; i < 90 && last !== 429; i++) {
      const r = await requestAs(t, undefined).get(`/api/visit/${randomUUID()}`);
      last = r.status;
      retryAfter = r.headers['retry-after'];
    }
    expect(last).toBe(429);
    expect(Number(retryAfter)).toBeGreaterThan(0);
    await expect(connected(track(visitor(t.url, board.slug)))).rejects.toThrow(/too many/i);
    expect((await signedIn(t, chief).get('/api/visitor-boards')).status).toBe(200);
  });
});
