import type { Role } from '../domain/roles.js';
import type { UnitSystem } from '../domain/units.js';

export interface LoginRequest {
  email: string;
  password: string;
}
export interface SessionUser {
  id: string;
  email: string;
  displayName: string;
  role: Role;
  unitSystem: UnitSystem;
}
/**
 * What sign-in, refresh and accepting an invitation answer. The refresh token is not in it: it travels only in an
 * httpOnly, SameSite=Strict cookie (Secure over HTTPS) scoped to /api/auth, out of reach of the page's scripts.
 */
export interface TokenPair {
  accessToken: string;
  /** Seconds until the access token expires. */
  accessExpiresInSeconds: number;
  user: SessionUser;
}
export interface ChangePasswordRequest {
  currentPassword: string;
  newPassword: string;
}
export interface SetSigningPinRequest {
  currentPassword: string;
  pin: string;
}
export interface AcceptInvitationRequest {
  token: string;
  password: string;
}
export interface UpdateMyPreferencesRequest {
  unitSystem?: UnitSystem;
  displayName?: string;
}
/** Smallest password length we accept (NIST SP 800-63B asks for at least 8). */
export const MIN_PASSWORD_LENGTH = 10;
