import type { Response } from 'supertest';
import { ROLES, type Role } from '@crankjournal/shared-types';
import { startTestApp, type TestApp } from './utils/test-app.js';
import { requestAs, signedIn } from './utils/signed-in.js';
import { createUser, login, uniqueEmail, type SignedIn } from './factories/users.factory.js';

const NOT_ADMIN = ROLES.filter((r) => r !== 'administrator');
const NOTICE_ROLES: Role[] = ['administrator', 'chief_engineer'];

describe('who may call what (API)', () => {
  let t: TestApp;
  const session = {} as Record<Role, SignedIn>;

  beforeAll(async () => {
    t = await startTestApp();
    for (const role of ROLES) session[role] = await login(t, role);
  });
  afterAll(async () => {
    await t?.close();
  });

  /** The administration routes, each with a body that would be accepted. */
  const adminRoutes: { name: string; ok: number; call: (token?: string) => Promise<Response> }[] = [
    {
      name: 'GET /api/users',
      ok: 200,
      call: (token) => {
        return requestAs(t, token).get('/api/users');
      },
    },
    {
      name: 'POST /api/users/invitations',
      ok: 201,
      call: (token) => {
        return requestAs(t, token)
          .post('/api/users/invitations')
          .send({
            email: uniqueEmail('invitee'),
            displayName: `Invited Person ${Date.now()}`,
            role: 'observer',
          });
      },
    },
    {
      name: 'PATCH /api/users/:id',
      ok: 200,
      call: async (token) => {
        const target = await createUser(t.db, { role: 'observer' });
        return requestAs(t, token)
          .patch(`/api/users/${target.id}`)
          .send({ displayName: `Renamed By Test ${Date.now()}` });
      },
    },
  ];

  describe.each(adminRoutes.map((r) => [r.name, r] as const))('%s', (_name, route) => {
    it('is allowed to an administrator', async () => {
      const res = await route.call(session.administrator.accessToken);
      expect(res.status).toBe(route.ok);
    });

    it.each(NOT_ADMIN)('is refused with 403 to %s', async (role) => {
      const res = await route.call(session[role].accessToken);
      expect(res.status).toBe(403);
      expect(res.body.statusCode).toBe(403);
    });

    it('is refused with 401 without a token', async () => {
      const res = await route.call();
      expect(res.status).toBe(401);
    });
  });

  it('the administrator really changed something (PATCH answers the new name)', async () => {
    const target = await createUser(t.db, { role: 'observer' });
    const res = await signedIn(t, session.administrator).patch(`/api/users/${target.id}`).send({ displayName: 'Renamed Observer' });
    expect(res.status).toBe(200);
    expect(res.body.displayName).toBe('Renamed Observer');
    const [row] = await t.db.query('SELECT display_name FROM users WHERE id = $1', [target.id]);
    expect(row.display_name).toBe('Renamed Observer');
  });

  it('a refused PATCH changes nothing', async () => {
    const target = await createUser(t.db, { role: 'observer', displayName: 'Unchanged Name' });
    const res = await signedIn(t, session.operator).patch(`/api/users/${target.id}`).send({ role: 'administrator' });
    expect(res.status).toBe(403);
    const [row] = await t.db.query('SELECT display_name, role FROM users WHERE id = $1', [target.id]);
    expect(row).toEqual({ display_name: 'Unchanged Name', role: 'observer' });
  });

  describe('POST /api/live/notices', () => {
    const post = (token?: string) => {
      return requestAs(t, token).post('/api/live/notices').send({ message: 'Engine house closes at four today.' });
    };

    it.each(NOTICE_ROLES)('is allowed to %s', async (role) => {
      const res = await post(session[role].accessToken);
      expect(res.status).toBe(202);
      expect(res.body).toEqual({ delivered: true });
    });

    it.each(ROLES.filter((r) => !NOTICE_ROLES.includes(r)))('is refused with 403 to %s', async (role) => {
      const res = await post(session[role].accessToken);
      expect(res.status).toBe(403);
    });

    it('is refused with 401 without a token', async () => {
      expect((await post()).status).toBe(401);
    });
  });
});
