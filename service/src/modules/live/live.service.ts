import { Injectable } from '@nestjs/common';
import type { ServerToClientEvents } from '@crankjournal/shared-types';
import type { LiveServer } from './live.gateway.js';

/** Other modules send live events through this service, never through the gateway directly. */
@Injectable()
export class LiveService {
  private server: LiveServer | null = null;

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
