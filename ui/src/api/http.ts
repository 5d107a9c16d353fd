import type { TokenPair } from '@crankjournal/shared-types';
import { sessionStore } from './session';
import { cachedAtOf, freshness } from './freshness';
import { HttpError, httpErrorOf, NetworkError } from './errors';

export { HttpError, NetworkError } from './errors';

let refreshing: Promise<boolean> | null = null;
let onSignedOut: () => void = () => {};
export function setSignedOutHandler(fn: () => void) {
  onSignedOut = fn;
}

async function refreshOnce(): Promise<boolean> {
  const s = sessionStore.get();
  if (!s) return false;
  refreshing ??= (async () => {
    try {
      // The refresh token rides in its httpOnly cookie (same origin); the page never sees it.
      const r = await fetch('/api/auth/refresh', { method: 'POST', credentials: 'same-origin' });
      if (!r.ok) return false;
      sessionStore.set((await r.json()) as TokenPair);
      return true;
    } catch {
      return false;
    } finally {
      setTimeout(() => (refreshing = null), 0);
    }
  })();
  return refreshing;
}

/** A query-string value; undefined, null and '' leave the parameter out. */
export type QueryValue = string | number | boolean | null | undefined;

/** The path with its query string (`/runs?engineId=…&state=…`), values encoded, empty ones left out. */
export function withQuery(path: string, params: Record<string, QueryValue>): string {
  const q = new URLSearchParams();
  for (const [k, v] of Object.entries(params)) if (v !== undefined && v !== null && v !== '') q.set(k, String(v));
  const s = q.toString();
  return s ? `${path}?${s}` : path;
}

export interface RequestOptions {
  method?: string;
  body?: unknown;
  /** Raw body (FormData, text) sent as is. */
  raw?: BodyInit;
  headers?: Record<string, string>;
  signal?: AbortSignal;
  /** Return the Response instead of parsing JSON (downloads). */
  asResponse?: boolean;
}

/** The one HTTP client: adds the access token, refreshes it once on 401, sends to sign-in when refresh fails. */
export async function api<T>(path: string, opts: RequestOptions = {}, retried = false): Promise<T> {
  const s = sessionStore.get();
  const headers: Record<string, string> = { ...(opts.headers ?? {}) };
  if (s) headers.authorization = `Bearer ${s.accessToken}`;
  let body: BodyInit | undefined = opts.raw;
  if (opts.body !== undefined) {
    headers['content-type'] = 'application/json';
    body = JSON.stringify(opts.body);
  }
  let res: Response;
  try {
    res = await fetch(`/api${path}`, { method: opts.method ?? (body ? 'POST' : 'GET'), headers, body, signal: opts.signal });
  } catch (e) {
    if ((e as Error).name === 'AbortError') throw e;
    throw new NetworkError('Cannot reach the Crankjournal server.');
  }
  if (res.status === 401 && s && !retried && !path.startsWith('/auth/login')) {
    if (await refreshOnce()) return api<T>(path, opts, true);
    sessionStore.set(null);
    onSignedOut();
    throw new HttpError(401, { statusCode: 401, error: 'Unauthorized', message: 'Your sign-in has ended. Please sign in again.' });
  }
  if (!res.ok) throw await httpErrorOf(res);
  const method = opts.method ?? (body ? 'POST' : 'GET');
  if (method === 'GET') freshness.note(path, cachedAtOf(res.headers));
  if (opts.asResponse) return res as unknown as T;
  if (res.status === 204) return undefined as T;
  const type = res.headers.get('content-type') ?? '';
  return (type.includes('json') ? await res.json() : await res.text()) as T;
}

/** Downloads a file from the API (CSV, PDF) with the user's token. */
export async function download(path: string, fallbackName: string) {
  const res = await api<Response>(path, { asResponse: true });
  const blob = await res.blob();
  const cd = res.headers.get('content-disposition') ?? '';
  const name = /filename="?([^";]+)"?/.exec(cd)?.[1] ?? fallbackName;
  const url = URL.createObjectURL(blob);
  const a = document.createElement('a');
  a.href = url;
  a.download = name;
  a.click();
  setTimeout(() => URL.revokeObjectURL(url), 10_000);
}

export function errorText(e: unknown): string {
  if (e instanceof HttpError) return e.messages.join(' ');
  if (e instanceof Error) return e.message;
  return 'Something went wrong.';
}
