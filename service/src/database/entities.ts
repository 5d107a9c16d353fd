import { User } from '../modules/users/user.entity.js';
import { Invitation } from '../modules/users/invitation.entity.js';
import { RefreshToken } from '../modules/auth/refresh-token.entity.js';

/** Every entity, in one list for the application and the migration CLI. Add new ones here. */
export const ENTITIES = [User, Invitation, RefreshToken];
