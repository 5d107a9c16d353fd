import { afterEach, describe, expect, it, vi } from 'vitest';
import { json, signIn, signOut, stubFetch, type StubRequest } from '../test-utils/http';
import { api } from './http';
import { sessionStore } from './session';

describe('the http client and the refresh cookie', () => {
  afterEach(async () => {
    signOut();
    vi.restoreAllMocks();
    await new Promise((r) => setTimeout(r, 0)); // the client forgets its finished refresh on the next tick
  });

  it('on a 401 it refreshes with the cookie alone (no token in the body) and retries once', async () => {
    signIn('operator', {}, { accessToken: 'old' });
    let seen = 0;
    const stub = stubFetch({
      'GET /auth/me': (req: StubRequest) => {
        seen++;
        const auth = new Headers(req.init?.headers).get('authorization');
        return auth === 'Bearer fresh' ? json({ ok: true }) : json({ statusCode: 401, message: 'expired' }, 401);
      },
      'POST /auth/refresh': { accessToken: 'fresh', accessExpiresInSeconds: 900, user: sessionStore.get()!.user },
    });
    expect(await api('/auth/me')).toEqual({ ok: true });
    expect(seen).toBe(2);
    const refresh = stub.calls.find((c) => c.path === '/auth/refresh')!;
    expect(refresh.body).toBeUndefined();
    expect(refresh.init?.credentials).toBe('same-origin');
    expect(sessionStore.get()?.accessToken).toBe('fresh');
    // Nothing but the access token and the person is kept in the browser's storage.
    expect(Object.keys(JSON.parse(localStorage.getItem('crankjournal.session')!) as object).sort()).toEqual(['accessToken', 'user']);
  });

  it('when the refresh is refused, the session ends', async () => {
    signIn('operator');
    stubFetch({
      'GET /auth/me': () => json({ statusCode: 401, message: 'expired' }, 401),
      'POST /auth/refresh': () => json({ statusCode: 401, message: 'Please sign in again.' }, 401),
    });
    await expect(api('/auth/me')).rejects.toMatchObject({ status: 401 });
    expect(sessionStore.get()).toBeNull();
  });
});
