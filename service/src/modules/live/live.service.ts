import { Injectable } from '@nestjs/common';
import type { ServerToClientEvents } from '@crankjournal/shared-types';
import { UserEvents } from '../../common/events/user-events.js';
import type { LiveServer } from './live.gateway.js';

/** Other modules send live events through this service, never through the gateway directly. */
@Injectable()
export class LiveService {
  private server: LiveServer | null = null;

  constructor(events: UserEvents) {
    // A deactivated person's open connections end at once: a socket checks the token only when it connects.
    events.on('deactivated', (userId) => this.disconnectUser(userId));
    events.on('sessionsEnded', (userId) => this.disconnectUser(userId));
  }

  attach(server: LiveServer) {
    this.server = server;
  }

  emitToRoom<E extends keyof ServerToClientEvents>(room: string, event: E, ...args: Parameters<ServerToClientEvents[E]>) {
    this.server?.to(room).emit(event, ...args);
  }

  /** Ends the live connections of a person (deactivated, or signed out everywhere). */
  disconnectUser(userId: string) {
    this.server?.in(`user:${userId}`).disconnectSockets(true);
  }
}
