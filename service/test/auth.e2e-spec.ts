import { JwtService } from '@nestjs/jwt';
import { startTestApp, type TestApp } from './utils/test-app.js';
import { signedIn } from './utils/signed-in.js';
import { createUser, login, refreshCookieFrom, signIn, uniqueEmail } from './factories/users.factory.js';

describe('sign-in and tokens (API)', () => {
  let t: TestApp;
  beforeAll(async () => {
    t = await startTestApp();
  });
  afterAll(async () => {
    await t?.close();
  });

  const me = (accessToken: string) => signedIn(t, accessToken).get('/api/auth/me');
  /** POST /api/auth/refresh with the given refresh cookie only (plain fetch: no cookie jar of the test agent). */
  const refresh = async (cookie: string) => {
    const res = await fetch(`${t.url}/api/auth/refresh`, { method: 'POST', headers: cookie ? { cookie } : {} });
    const body = (await res.json()) as { accessToken?: string };
    return { status: res.status, body, cookie: refreshCookieFrom(res.headers.getSetCookie()) };
  };

  it('signs in with the right password and returns a token pair', async () => {
    const u = await createUser(t.db, { role: 'operator' });
    const res = await t.http.post('/api/auth/login').send({ email: u.email, password: u.password });
    expect(res.status).toBe(200);
    expect(typeof res.body.accessToken).toBe('string');
    expect(res.body.accessToken.split('.')).toHaveLength(3);
    // The refresh token is in an httpOnly, SameSite=Strict cookie for /api/auth only, never in the body.
    expect(res.body.refreshToken).toBeUndefined();
    expect(refreshCookieFrom(res.headers['set-cookie'])).toMatch(/^cj_refresh=[0-9a-f-]{36}\./);
    expect(res.body.user).toMatchObject({ id: u.id, email: u.email, role: 'operator' });
    expect(res.body.user.passwordHash).toBeUndefined();
    // The access token works.
    const who = await me(res.body.accessToken);
    expect(who.status).toBe(200);
    expect(who.body.id).toBe(u.id);
  });

  it('signs in whatever the case of the e-mail address', async () => {
    const u = await createUser(t.db);
    const res = await t.http.post('/api/auth/login').send({ email: u.email.toUpperCase(), password: u.password });
    expect(res.status).toBe(200);
  });

  it('refuses a wrong password with 401', async () => {
    const u = await createUser(t.db);
    const res = await t.http.post('/api/auth/login').send({ email: u.email, password: `${u.password}x` });
    expect(res.status).toBe(401);
    expect(res.body.accessToken).toBeUndefined();
  });

  it('refuses an unknown user with 401 and the same message as a wrong password', async () => {
    const u = await createUser(t.db);
    const wrong = await t.http.post('/api/auth/login').send({ email: u.email, password: 'not-the-password' });
    const unknown = await t.http.post('/api/auth/login').send({ email: uniqueEmail('nobody'), password: 'not-the-password' });
    expect(unknown.status).toBe(401);
    expect(unknown.body.accessToken).toBeUndefined();
    expect(unknown.body.message).toBe(wrong.body.message);
  });

  it('refuses a deactivated user at sign-in, and their earlier access token stops working', async () => {
    const admin = await login(t, 'administrator');
    const u = await createUser(t.db, { role: 'operator' });
    const before = await signIn(t, u);
    expect((await me(before.accessToken)).status).toBe(200);

    const off = await signedIn(t, admin).patch(`/api/users/${u.id}`).send({ active: false });
    expect(off.status).toBe(200);
    expect(off.body.active).toBe(false);

    const again = await t.http.post('/api/auth/login').send({ email: u.email, password: u.password });
    expect(again.status).toBe(401);
    expect((await me(before.accessToken)).status).toBe(401);
    // Nor can the refresh token of the earlier sign-in bring the session back.
    const refreshed = await refresh(before.refreshCookie);
    expect(refreshed.status).toBe(401);
  });

  it('answers 429 once LOGIN_RATE_LIMIT_PER_MINUTE attempts for one e-mail have been made', async () => {
    const limit = Number(process.env.LOGIN_RATE_LIMIT_PER_MINUTE);
    expect(limit).toBeGreaterThan(0);
    const u = await createUser(t.db);
    for (let i = 0; i < limit; i++) {
      const res = await t.http.post('/api/auth/login').send({ email: u.email, password: 'wrong-password' });
      expect(res.status).toBe(401);
    }
    const blocked = await t.http.post('/api/auth/login').send({ email: u.email, password: 'wrong-password' });
    expect(blocked.status).toBe(429);
    // Even the right password waits for the minute to pass.
    const right = await t.http.post('/api/auth/login').send({ email: u.email, password: u.password });
    expect(right.status).toBe(429);
    // Another person on the same address is not locked out.
    const other = await createUser(t.db);
    const otherRes = await t.http.post('/api/auth/login').send({ email: other.email, password: other.password });
    expect(otherRes.status).toBe(200);
  });

  it('rotates refresh tokens: a new pair each time, the used one refused, reuse ends the family', async () => {
    const first = await login(t, 'chief_engineer');
    const r1 = await refresh(first.refreshCookie);
    expect(r1.status).toBe(200);
    expect(r1.cookie).toMatch(/^cj_refresh=/);
    expect(r1.cookie).not.toBe(first.refreshCookie);
    expect(typeof r1.body.accessToken).toBe('string');
    expect((await me(r1.body.accessToken!)).status).toBe(200);

    // The used token again: refused...
    const reuse = await refresh(first.refreshCookie);
    expect(reuse.status).toBe(401);
    // ...and the whole family ends, so the newest token is refused too.
    const successor = await refresh(r1.cookie);
    expect(successor.status).toBe(401);
  });

  it('keeps other sign-ins of the same person when one family is ended', async () => {
    const u = await createUser(t.db);
    const a = await signIn(t, u);
    const b = await signIn(t, u);
    await refresh(a.refreshCookie);
    await refresh(a.refreshCookie); // reuse ends family a
    const stillB = await refresh(b.refreshCookie);
    expect(stillB.status).toBe(200);
  });

  it('refuses an access token whose expiry has passed, though signed with the right secret', async () => {
    const u = await login(t, 'operator');
    const jwt = new JwtService({ secret: process.env.JWT_SECRET });
    const now = Math.floor(Date.now() / 1000);
    const expired = await jwt.signAsync({ sub: u.user.id, role: u.user.role, iat: now - 3600, exp: now - 60 }, { algorithm: 'HS256' });
    const res = await me(expired);
    expect(res.status).toBe(401);
    // Control: the same claims with a future expiry are accepted, so the refusal above is the expiry.
    const valid = await jwt.signAsync({ sub: u.user.id, role: u.user.role, iat: now, exp: now + 600 }, { algorithm: 'HS256' });
    expect((await me(valid)).status).toBe(200);
    // And a token signed with another secret is refused.
    const forged = await new JwtService({ secret: 'some-other-secret-0123456789' }).signAsync(
      { sub: u.user.id, role: 'administrator', iat: now, exp: now + 600 },
      { algorithm: 'HS256' },
    );
    expect((await me(forged)).status).toBe(401);
  });

  it('refuses requests without a token, or with a malformed one', async () => {
    expect((await t.http.get('/api/auth/me')).status).toBe(401);
    expect((await me('not-a-token')).status).toBe(401);
  });

  it('logout revokes the refresh token', async () => {
    const s = await login(t, 'mill_lead');
    const out = await fetch(`${t.url}/api/auth/logout`, {
      method: 'POST',
      headers: { authorization: `Bearer ${s.accessToken}`, cookie: s.refreshCookie },
    });
    expect(out.status).toBe(204);
    expect(out.headers.getSetCookie().join()).toMatch(/cj_refresh=;/);
    const res = await refresh(s.refreshCookie);
    expect(res.status).toBe(401);
  });

  it('changes the own password: the old one stops working, the new one works', async () => {
    const s = await login(t, 'maintenance_lead');
    const newPassword = `new-${s.account.password}`;

    const wrongCurrent = await signedIn(t, s).post('/api/auth/password').send({ currentPassword: 'not-my-password', newPassword });
    expect(wrongCurrent.status).toBe(400);

    const tooShort = await signedIn(t, s).post('/api/auth/password').send({ currentPassword: s.account.password, newPassword: 'short' });
    expect(tooShort.status).toBe(400);

    const ok = await signedIn(t, s).post('/api/auth/password').send({ currentPassword: s.account.password, newPassword });
    expect(ok.status).toBe(204);

    const old = await t.http.post('/api/auth/login').send({ email: s.account.email, password: s.account.password });
    expect(old.status).toBe(401);
    const fresh = await t.http.post('/api/auth/login').send({ email: s.account.email, password: newPassword });
    expect(fresh.status).toBe(200);
    // The sign-ins made with the old password end.
    const refreshOld = await refresh(s.refreshCookie);
    expect(refreshOld.status).toBe(401);
  });
});
