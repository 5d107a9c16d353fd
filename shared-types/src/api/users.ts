import type { Role } from '../domain/roles.js';
import type { UnitSystem } from '../domain/units.js';

export interface UserSummary {
  id: string;
  email: string;
  displayName: string;
  role: Role;
  active: boolean;
  unitSystem: UnitSystem;
  /** True until the person has set a password from their invitation. */
  invitationPending: boolean;
  createdAt: string;
}
export interface InviteUserRequest {
  email: string;
  displayName: string;
  role: Role;
}
export interface UpdateUserRequest {
  role?: Role;
  active?: boolean;
  displayName?: string;
}
/** A person as others see them when choosing a crew (no e-mail address). */
export interface CrewMemberSummary {
  id: string;
  displayName: string;
  role: Role;
}
