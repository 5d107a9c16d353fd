import type { Server, Socket } from 'socket.io';
import type { ClientToServerEvents, ServerToClientEvents } from '@crankjournal/shared-types';
import type { AuthUser } from '../decorators/current-user.decorator.js';

/**
 * The live channel's server and socket, typed by the shared event lists; `data.user` is the person the socket
 * authenticated as when it connected. Shared by every gateway on the channel (live's rooms, runs' events).
 */
export type LiveServer = Server<ClientToServerEvents, ServerToClientEvents, Record<string, never>, { user: AuthUser }>;
export type LiveSocket = Socket<ClientToServerEvents, ServerToClientEvents, Record<string, never>, { user: AuthUser }>;
