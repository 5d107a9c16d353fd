import { randomUUID } from 'node:crypto';
import type { DataSource } from 'typeorm';
import type { Role, TokenPair } from '@crankjournal/shared-types';
import { User } from '../../src/modules/users/user.entity.js';
import { hashPassword } from '../../src/common/util/password.util.js';
import type { TestApp } from '../utils/test-app.js';

export interface CreatedUser {
  id: string;
  email: string;
  displayName: string;
  role: Role;
  /** The plain password the user was created with. */
  password: string;
}

export interface CreateUserOptions {
  role?: Role;
  password?: string;
  active?: boolean;
  displayName?: string;
  /** Defaults to a unique address, so re-runs and test order never collide. */
  email?: string;
}

/** A unique e-mail address in the tests' own domain. */
export function uniqueEmail(prefix = 'user'): string {
  return `${prefix}-${randomUUID()}@e2e.crankjournal.test`;
}

/** Creates a user straight in the database, with a known password (argon2id, as the service stores it). */
export async function createUser(db: DataSource, opts: CreateUserOptions = {}): Promise<CreatedUser> {
  const role = opts.role ?? 'operator';
  const password = opts.password ?? `pw-${randomUUID()}`;
  const email = (opts.email ?? uniqueEmail(role)).toLowerCase();
  // Display names are unique among active people: a part of the address's random id makes each one its own.
  const displayName = opts.displayName ?? `Test ${role.replace('_', ' ')} ${email.replace(/^[^-]*-/, '').slice(0, 8)}`;
  const repo = db.getRepository(User);
  const saved = await repo.save(
    repo.create({ email, displayName, role, active: opts.active ?? true, passwordHash: await hashPassword(password) }),
  );
  return { id: saved.id, email, displayName, role, password };
}

export interface SignedIn extends TokenPair {
  account: CreatedUser;
  /** `cj_refresh=<token>`: the refresh cookie the sign-in set (send it as the Cookie header to /api/auth/refresh). */
  refreshCookie: string;
}

/** The `cj_refresh=…` pair of a response's Set-Cookie headers ('' when none was set). */
export function refreshCookieFrom(setCookie: string[] | string | null | undefined): string {
  const all = Array.isArray(setCookie) ? setCookie : setCookie ? [setCookie] : [];
  return all.map((c) => c.split(';')[0].trim()).find((c) => c.startsWith('cj_refresh=') && c.length > 'cj_refresh='.length) ?? '';
}

/** Signs a user in through the API; fails loudly when the sign-in is refused. */
export async function signIn(t: TestApp, account: CreatedUser): Promise<SignedIn> {
  const res = await t.http.post('/api/auth/login').send({ email: account.email, password: account.password });
  if (res.status !== 200) throw new Error(`sign-in of ${account.email} failed: ${res.status} ${JSON.stringify(res.body)}`);
  return { ...(res.body as TokenPair), account, refreshCookie: refreshCookieFrom(res.headers['set-cookie']) };
}

/** Creates a fresh user of `role` and signs them in. */
export async function login(t: TestApp, role: Role, opts: Omit<CreateUserOptions, 'role'> = {}): Promise<SignedIn> {
  return signIn(t, await createUser(t.db, { ...opts, role }));
}

/** The factory bound to one test app: `const users = usersFactory(t); await users.login('observer')`. */
export function usersFactory(t: TestApp) {
  return {
    create: (opts: CreateUserOptions = {}) => createUser(t.db, opts),
    login: (role: Role, opts: Omit<CreateUserOptions, 'role'> = {}) => login(t, role, opts),
    signIn: (account: CreatedUser) => signIn(t, account),
  };
}
