import type { Request, Response } from 'express';

/**
 * The refresh token's cookie: httpOnly (no script reads it), SameSite=Strict (no other site's page sends it),
 * Secure when the request came over HTTPS (directly, or from a trusted proxy's X-Forwarded-Proto), and sent
 * only to /api/auth (refresh, and sign-out, which revokes it). It ends with the token family.
 */
export const REFRESH_COOKIE = 'cj_refresh';
const PATH = '/api/auth';

export function setRefreshCookie(req: Request, res: Response, token: string, expiresAt: Date) {
  res.cookie(REFRESH_COOKIE, token, { httpOnly: true, secure: req.secure, sameSite: 'strict', path: PATH, expires: expiresAt });
}

export function clearRefreshCookie(req: Request, res: Response) {
  res.clearCookie(REFRESH_COOKIE, { httpOnly: true, secure: req.secure, sameSite: 'strict', path: PATH });
}

/** The refresh token the request's Cookie header carries, if any. */
export function refreshCookieOf(req: Request): string | undefined {
  for (const part of (req.headers.cookie ?? '').split(';')) {
    const eq = part.indexOf('=');
    if (eq > 0 && part.slice(0, eq).trim() === REFRESH_COOKIE) return decodeURIComponent(part.slice(eq + 1).trim());
  }
  return undefined;
}
