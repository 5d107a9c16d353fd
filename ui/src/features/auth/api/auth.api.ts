import type { LoginRequest, SessionUser, TokenPair, UpdateMyPreferencesRequest } from '@crankjournal/shared-types';
import { api } from '../../../api/http';
import { sessionStore } from '../../../api/session';

export async function signIn(req: LoginRequest): Promise<TokenPair> {
  const pair = await api<TokenPair>('/auth/login', { body: req });
  sessionStore.set(pair);
  return pair;
}

export async function signOut(): Promise<void> {
  const s = sessionStore.get();
  try {
    // The server revokes the refresh token its cookie carries, and clears the cookie.
    if (s) await api('/auth/logout', { method: 'POST' });
  } catch {
    /* signed out locally whatever the server says */
  }
  // Loaded here rather than imported above, so the sign-in page does not carry the live channel's client.
  (await import('../../../api/socket')).closeSocket();
  sessionStore.set(null);
  // What the service worker kept of the API was read under this sign-in: the next person starts without it.
  if (typeof caches !== 'undefined') await caches.delete('cj-api').catch(() => false);
}

export async function acceptInvitation(token: string, password: string): Promise<TokenPair> {
  const pair = await api<TokenPair>('/auth/accept-invitation', { body: { token, password } });
  sessionStore.set(pair);
  return pair;
}

export async function updateMe(req: UpdateMyPreferencesRequest): Promise<SessionUser> {
  const user = await api<SessionUser>('/auth/me', { method: 'PATCH', body: req });
  sessionStore.updateUser(user);
  return user;
}

export function changePassword(currentPassword: string, newPassword: string) {
  return api<void>('/auth/password', { body: { currentPassword, newPassword } });
}
export function setSigningPin(currentPassword: string, pin: string) {
  return api<void>('/auth/signing-pin', { body: { currentPassword, pin } });
}
