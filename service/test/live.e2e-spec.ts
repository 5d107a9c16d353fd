import type { Socket } from 'socket.io-client';
import type { JoinRoomAck, LiveErrorEvent, SiteNotice } from '@crankjournal/shared-types';
import { startTestApp, type TestApp } from './utils/test-app.js';
import { connected, socketAs } from './utils/socket.js';
import { signedIn } from './utils/signed-in.js';
import { login } from './factories/users.factory.js';

const WAIT_MS = 5_000;

/** Resolves with the next `event` on `socket`, or rejects after WAIT_MS. */
function next<T>(socket: Socket, event: string): Promise<T> {
  return new Promise((resolve, reject) => {
    const timer = setTimeout(() => reject(new Error(`no "${event}" within ${WAIT_MS} ms`)), WAIT_MS);
    socket.once(event, (payload: T) => {
      clearTimeout(timer);
      resolve(payload);
    });
  });
}

/** Emits with an acknowledgement and resolves with it, or rejects after WAIT_MS. */
function emitWithAck<T>(socket: Socket, event: string, payload: unknown): Promise<T> {
  return socket.timeout(WAIT_MS).emitWithAck(event, payload) as Promise<T>;
}

describe('the live channel (socket.io)', () => {
  let t: TestApp;
  const sockets: Socket[] = [];

  /** A client that has not connected yet; closed after each test. */
  const client = (token?: string) => {
    const s = socketAs(t.url, token, { autoConnect: false });
    sockets.push(s);
    return s;
  };

  beforeAll(async () => {
    t = await startTestApp();
  });
  afterEach(() => {
    for (const s of sockets.splice(0)) s.disconnect();
  });
  afterAll(async () => {
    await t?.close();
  });

  it('refuses a connection without a token with connect_error', async () => {
    const s = client();
    const err = await new Promise<Error>((resolve, reject) => {
      s.once('connect', () => reject(new Error('connected without a token')));
      s.once('connect_error', resolve);
      s.connect();
    });
    expect(err.message).toMatch(/access token/i);
    expect(s.connected).toBe(false);
  });

  it('refuses a connection with a token that is not valid', async () => {
    const s = client('not-a-valid-token');
    await expect(connected(s)).rejects.toThrow();
    expect(s.connected).toBe(false);
  });

  it('connects with a token, joins the site room and receives a site notice', async () => {
    const operator = await login(t, 'operator');
    const chief = await login(t, 'chief_engineer');
    const s = client(operator.accessToken);
    await connected(s);
    expect(s.connected).toBe(true);

    const ack = await emitWithAck<JoinRoomAck>(s, 'room:join', { room: 'site' });
    expect(ack).toEqual({ ok: true, room: 'site' });

    const message = `Boiler inspection at ten, notice ${Date.now()}`;
    const arrived = next<SiteNotice>(s, 'site:notice');
    const res = await signedIn(t, chief).post('/api/live/notices').send({ message });
    expect(res.status).toBe(202);
    const notice = await arrived;
    expect(notice.message).toBe(message);
    expect(notice.from).toBe(chief.user.displayName);
    expect(Number.isNaN(Date.parse(notice.at))).toBe(false);
  });

  it('refuses an observer joining the administration room (ack ok:false), but lets an administrator in', async () => {
    const observer = await login(t, 'observer');
    const s = client(observer.accessToken);
    await connected(s);
    const ack = await emitWithAck<JoinRoomAck>(s, 'room:join', { room: 'administration' });
    expect(ack.ok).toBe(false);
    expect(typeof ack.error).toBe('string');

    const admin = await login(t, 'administrator');
    const a = client(admin.accessToken);
    await connected(a);
    const adminAck = await emitWithAck<JoinRoomAck>(a, 'room:join', { room: 'administration' });
    expect(adminAck).toEqual({ ok: true, room: 'administration' });
  });

  it('answers an unknown field in the join payload with live:error and an error ack', async () => {
    const u = await login(t, 'mill_lead');
    const s = client(u.accessToken);
    await connected(s);
    const liveError = next<LiveErrorEvent>(s, 'live:error');
    const ack = await emitWithAck<JoinRoomAck & { status?: number }>(s, 'room:join', { room: 'site', sneaky: true });
    expect(ack.ok).toBe(false);
    expect(ack.error).toMatch(/sneaky/);
    const err = await liveError;
    expect(err.event).toBe('room:join');
    const text = Array.isArray(err.message) ? err.message.join(' ') : err.message;
    expect(text).toMatch(/sneaky/);
    // The connection survives a refused event.
    expect(s.connected).toBe(true);
    expect(await emitWithAck<JoinRoomAck>(s, 'room:join', { room: 'site' })).toEqual({ ok: true, room: 'site' });
  });

  it("ends a person's open connection when an administrator deactivates them, and keeps everyone else's", async () => {
    const admin = await login(t, 'administrator');
    const operator = await login(t, 'operator');
    const other = await login(t, 'operator');
    const s = socketAs(t.url, operator);
    const o = socketAs(t.url, other);
    sockets.push(s, o);
    await connected(s);
    await connected(o);

    const closed = next<string>(s, 'disconnect');
    const off = await signedIn(t, admin).patch(`/api/users/${operator.user.id}`).send({ active: false });
    expect(off.status).toBe(200);
    // The server closed the socket (not the client): socket.io reports "io server disconnect".
    expect(await closed).toBe('io server disconnect');
    expect(s.connected).toBe(false);
    expect(o.connected).toBe(true);
    expect(await emitWithAck<JoinRoomAck>(o, 'room:join', { room: 'site' })).toEqual({ ok: true, room: 'site' });
  });
});
