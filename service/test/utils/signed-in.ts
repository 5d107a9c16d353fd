import type { Test } from 'supertest';
import type { SignedIn } from '../factories/users.factory.js';
import { bearer, type TestApp } from './test-app.js';

/** Who makes a request: a signed-in session or a bare access token (minted tokens, expired tokens). */
export type Who = SignedIn | string;

export const tokenOf = (who: Who) => (typeof who === 'string' ? who : who.accessToken);

/** Requests through the test app's supertest agent, each with the `Authorization` header of one person. */
export interface SignedInClient {
  get(path: string): Test;
  post(path: string): Test;
  put(path: string): Test;
  patch(path: string): Test;
  delete(path: string): Test;
}

/**
 * Requests as `who` (or with no `Authorization` header at all when there is no `who`, for the 401
 * cases of a role table): `await requestAs(t, operator).post('/api/runs').send(body)`.
 */
export function requestAs(t: Pick<TestApp, 'http'>, who: Who | undefined): SignedInClient {
  const header = who ? bearer(tokenOf(who)) : undefined;
  const withHeader = (req: Test) => (header ? req.set('Authorization', header) : req);
  return {
    get: (path) => withHeader(t.http.get(path)),
    post: (path) => withHeader(t.http.post(path)),
    put: (path) => withHeader(t.http.put(path)),
    patch: (path) => withHeader(t.http.patch(path)),
    delete: (path) => withHeader(t.http.delete(path)),
  };
}

/** Requests as a signed-in person: `await signedIn(t, chief).get('/api/engines')`. */
export const signedIn = (t: Pick<TestApp, 'http'>, who: Who): SignedInClient => requestAs(t, who);

/** `Authorization` header of `who` for plain fetch calls: `{ authorization: 'Bearer …' }`. */
export const authHeader = (who: Who): { authorization: string } => ({ authorization: bearer(tokenOf(who)) });

/**
 * A JSON call as `who` over fetch, to an app in this process (`t.url`) or a service in another one.
 * Fails loudly on an answer of 300 or more; the answer's body otherwise, typed by the caller.
 */
export async function fetchJson<T = unknown>(baseUrl: string, method: string, path: string, who: Who, body?: unknown): Promise<T> {
  const res = await fetch(`${baseUrl}${path}`, {
    method,
    headers: { ...authHeader(who), 'content-type': 'application/json' },
    body: body === undefined ? undefined : JSON.stringify(body),
  });
  const json: unknown = await res.json().catch(() => null);
  if (res.status >= 300) throw new Error(`${method} ${path}: ${res.status} ${JSON.stringify(json)}`);
  return json as T;
}
