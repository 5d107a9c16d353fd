import type { Role } from '../domain/roles.js';
import type { UnitSystem } from '../domain/units.js';

export interface LoginRequest {
  email: string;
  password: string;
}
export interface RefreshRequest {
  refreshToken: string;
}
export interface SessionUser {
  id: string;
  email: string;
  displayName: string;
  role: Role;
  unitSystem: UnitSystem;
}
export interface TokenPair {
  accessToken: string;
  /** Seconds until the access token expires. */
  accessExpiresInSeconds: number;
  refreshToken: string;
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
