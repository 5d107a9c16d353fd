import type { MailJobDto } from '@crankjournal/shared-types';
import { startTestApp, type TestApp } from './utils/test-app.js';
import { requestAs } from './utils/signed-in.js';
import { login, uniqueEmail, type SignedIn } from './factories/users.factory.js';
import { waitForMessage } from './utils/mail-inbox.js';

describe('invitations, health and API documentation (API)', () => {
  let t: TestApp;
  let admin: SignedIn;

  beforeAll(async () => {
    t = await startTestApp();
    admin = await login(t, 'administrator');
  });
  afterAll(async () => {
    await t?.close();
  });

  it('the invitation e-mail goes through the durable queue, and only the administrator sees the queue', async () => {
    const email = uniqueEmail('queued');
    const invited = await requestAs(t, admin).post('/api/users/invitations').send({ email, displayName: 'Quinn Queued', role: 'observer' });
    expect(invited.status).toBe(201);
    await waitForMessage(email, { subject: 'invited' });
    // The worker marks the job done just after the SMTP server took it.
    let job: MailJobDto | undefined;
    for (let i = 0; i < 50 && job?.state !== 'completed'; i++) {
      const jobs = await requestAs(t, admin).get('/api/mail/jobs');
      expect(jobs.status).toBe(200);
      job = (jobs.body as MailJobDto[]).find((j) => j.to === email);
      if (job?.state !== 'completed') await new Promise((r) => setTimeout(r, 100));
    }
    expect(job).toMatchObject({ state: 'completed', tries: 1, lastError: null, subject: expect.stringContaining('invited') });
    const chief = await login(t, 'chief_engineer');
    expect((await requestAs(t, chief).get('/api/mail/jobs')).status).toBe(403);
    expect((await t.http.get('/api/mail/jobs')).status).toBe(401);
  });

  it('an invited person gets an e-mail, sets a password from its link once, and signs in with it', async () => {
    const email = uniqueEmail('invitee');
    const invited = await requestAs(t, admin)
      .post('/api/users/invitations')
      .send({ email, displayName: `Ivy Invitee ${email.slice(8, 16)}`, role: 'operator' });
    expect(invited.status).toBe(201);
    expect(invited.body).toMatchObject({ email, role: 'operator', active: true, invitationPending: true });

    // Not signed in yet: there is no password.
    const early = await t.http.post('/api/auth/login').send({ email, password: 'anything-at-all' });
    expect(early.status).toBe(401);

    const mail = await waitForMessage(email, { subject: 'invited' });
    expect(mail.to).toContain(email);
    expect(mail.text).toContain('on the engine house crew list as engine operator');
    const publicUrl = process.env.PUBLIC_URL!.replace(/\/$/, '');
    const escaped = publicUrl.replace(/[.*+?^${}()|[\]\\]/g, '\\$&');
    const link = mail.text.match(new RegExp(`${escaped}/set-password\\?token=([^\\s]+)`));
    expect(link).not.toBeNull();
    const token = decodeURIComponent(link![1]);
    expect(token.length).toBeGreaterThanOrEqual(20);

    const password = `chosen-${Date.now()}-password`;
    const accepted = await t.http.post('/api/auth/accept-invitation').send({ token, password });
    expect(accepted.status).toBe(200);
    expect(typeof accepted.body.accessToken).toBe('string');
    expect(accepted.body.user).toMatchObject({ email, role: 'operator' });

    const signedIn = await t.http.post('/api/auth/login').send({ email, password });
    expect(signedIn.status).toBe(200);
    expect(signedIn.body.user.email).toBe(email);

    // The link works once.
    const twice = await t.http.post('/api/auth/accept-invitation').send({ token, password: 'another-password-here' });
    expect(twice.status).toBe(400);
    const still = await t.http.post('/api/auth/login').send({ email, password });
    expect(still.status).toBe(200);

    // The administrator's list no longer shows the invitation as pending.
    const list = await requestAs(t, admin).get('/api/users');
    expect(list.status).toBe(200);
    const row = (list.body as { email: string; invitationPending: boolean }[]).find((u) => u.email === email);
    expect(row?.invitationPending).toBe(false);
  });

  it('lets only one of two simultaneous uses of the same link through', async () => {
    const email = uniqueEmail('race');
    const invited = await requestAs(t, admin)
      .post('/api/users/invitations')
      .send({ email, displayName: `Rae Race ${email.slice(5, 13)}`, role: 'observer' });
    expect(invited.status).toBe(201);
    const mail = await waitForMessage(email);
    const token = decodeURIComponent(mail.text.match(/set-password\?token=([^\s]+)/)![1]);
    const [a, b] = await Promise.all([
      t.http.post('/api/auth/accept-invitation').send({ token, password: 'first-password-123' }),
      t.http.post('/api/auth/accept-invitation').send({ token, password: 'second-password-456' }),
    ]);
    expect([a.status, b.status].sort()).toEqual([200, 400]);
    const winner = a.status === 200 ? 'first-password-123' : 'second-password-456';
    const loser = a.status === 200 ? 'second-password-456' : 'first-password-123';
    expect((await t.http.post('/api/auth/login').send({ email, password: winner })).status).toBe(200);
    expect((await t.http.post('/api/auth/login').send({ email, password: loser })).status).toBe(401);
  });

  it('refuses a made-up invitation token', async () => {
    const res = await t.http.post('/api/auth/accept-invitation').send({ token: 'x'.repeat(43), password: 'some-password-123' });
    expect(res.status).toBe(400);
  });

  it('refuses to invite an address that already has an account (409)', async () => {
    const res = await requestAs(t, admin)
      .post('/api/users/invitations')
      .send({ email: admin.user.email, displayName: 'Again', role: 'observer' });
    expect(res.status).toBe(409);
  });

  it('GET /api/health answers ok with the database up', async () => {
    const res = await t.http.get('/api/health');
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ status: 'ok', database: 'up' });
  });

  it('GET /api/docs-json describes the sign-in route', async () => {
    const res = await t.http.get('/api/docs-json');
    expect(res.status).toBe(200);
    expect(res.body.openapi).toMatch(/^3\./);
    expect(res.body.paths['/api/auth/login']).toBeDefined();
    expect(res.body.paths['/api/auth/login'].post).toBeDefined();
  });
});
