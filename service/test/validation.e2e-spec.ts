import { startTestApp, type TestApp } from './utils/test-app.js';
import { signedIn } from './utils/signed-in.js';
import { createUser, login, uniqueEmail, type SignedIn } from './factories/users.factory.js';

/** True when one of the answer's messages names `field`. */
const names = (body: { message?: unknown }, field: string) =>
  Array.isArray(body.message) && body.message.some((m) => typeof m === 'string' && m.includes(field));

describe('the API edge refuses bad input (API)', () => {
  let t: TestApp;
  let admin: SignedIn;

  beforeAll(async () => {
    t = await startTestApp();
    admin = await login(t, 'administrator');
  });
  afterAll(async () => {
    await t?.close();
  });

  const userCount = async () => Number((await t.db.query('SELECT count(*)::int AS n FROM users'))[0].n);
  const userExists = async (email: string) => (await t.db.query('SELECT 1 FROM users WHERE email = $1', [email.toLowerCase()])).length > 0;
  const invite = (body: unknown) =>
    signedIn(t, admin)
      .post('/api/users/invitations')
      .send(body as object);

  describe('POST /api/users/invitations', () => {
    it('accepts a well-formed invitation (control for the cases below)', async () => {
      const email = uniqueEmail('valid');
      const res = await invite({ email, displayName: `Valid Invitee ${email.slice(0, 16)}`, role: 'observer' });
      expect(res.status).toBe(201);
      expect(await userExists(email)).toBe(true);
    });

    it('refuses an unknown field with 400 naming it, and writes nothing', async () => {
      const before = await userCount();
      const email = uniqueEmail('unknown-field');
      const res = await invite({ email, displayName: 'Extra Field', role: 'observer', isSuperuser: true });
      expect(res.status).toBe(400);
      expect(Array.isArray(res.body.message)).toBe(true);
      expect(names(res.body, 'isSuperuser')).toBe(true);
      expect(await userCount()).toBe(before);
      expect(await userExists(email)).toBe(false);
    });

    it('refuses wrong types with 400 naming each field, and writes nothing', async () => {
      const before = await userCount();
      const res = await invite({ email: 12345, displayName: ['not', 'text'], role: 'captain' });
      expect(res.status).toBe(400);
      expect(names(res.body, 'email')).toBe(true);
      expect(names(res.body, 'displayName')).toBe(true);
      expect(names(res.body, 'role')).toBe(true);
      expect(await userCount()).toBe(before);
    });

    it('refuses missing fields with 400 naming each, and writes nothing', async () => {
      const before = await userCount();
      const email = uniqueEmail('missing');
      const res = await invite({ email });
      expect(res.status).toBe(400);
      expect(names(res.body, 'displayName')).toBe(true);
      expect(names(res.body, 'role')).toBe(true);
      expect(names(res.body, 'email')).toBe(false);
      expect(await userCount()).toBe(before);
      expect(await userExists(email)).toBe(false);
    });

    it('answers malformed JSON with 400, not 500, and writes nothing', async () => {
      const before = await userCount();
      const res = await signedIn(t, admin)
        .post('/api/users/invitations')
        .set('Content-Type', 'application/json')
        .send('{"email": "half@e2e.crankjournal.test", "role": ');
      expect(res.status).toBe(400);
      expect(res.body.statusCode).toBe(400);
      expect(await userCount()).toBe(before);
    });
  });

  describe('POST /api/auth/login', () => {
    it('refuses an unknown field with 400 naming it', async () => {
      const u = await createUser(t.db);
      const res = await t.http.post('/api/auth/login').send({ email: u.email, password: u.password, remember: true });
      expect(res.status).toBe(400);
      expect(names(res.body, 'remember')).toBe(true);
      expect(res.body.accessToken).toBeUndefined();
    });

    it('refuses wrong types with 400 naming each field', async () => {
      const res = await t.http.post('/api/auth/login').send({ email: 42, password: { secret: true } });
      expect(res.status).toBe(400);
      expect(names(res.body, 'email')).toBe(true);
      expect(names(res.body, 'password')).toBe(true);
    });

    it('refuses missing fields with 400 naming each', async () => {
      const res = await t.http.post('/api/auth/login').send({});
      expect(res.status).toBe(400);
      expect(names(res.body, 'email')).toBe(true);
      expect(names(res.body, 'password')).toBe(true);
    });

    it('answers malformed JSON with 400, not 500', async () => {
      const res = await t.http.post('/api/auth/login').set('Content-Type', 'application/json').send('{"email": ');
      expect(res.status).toBe(400);
      expect(res.body.statusCode).toBe(400);
    });
  });

  describe('PATCH /api/users/:id', () => {
    it('refuses an id that is not a UUID with 400 naming id', async () => {
      const res = await signedIn(t, admin).patch('/api/users/not-a-uuid').send({ displayName: 'X' });
      expect(res.status).toBe(400);
      expect(names(res.body, 'id')).toBe(true);
    });

    it('answers 404 for a well-formed id nobody has (control: the 400 above is about the form)', async () => {
      const res = await signedIn(t, admin).patch('/api/users/00000000-0000-4000-8000-000000000000').send({ displayName: 'X' });
      expect(res.status).toBe(404);
    });

    it('refuses a wrong type in the body and leaves the user unchanged', async () => {
      const target = await createUser(t.db, { role: 'observer' });
      const res = await signedIn(t, admin).patch(`/api/users/${target.id}`).send({ active: 'no' });
      expect(res.status).toBe(400);
      expect(names(res.body, 'active')).toBe(true);
      const [row] = await t.db.query('SELECT active FROM users WHERE id = $1', [target.id]);
      expect(row.active).toBe(true);
    });
  });
});
