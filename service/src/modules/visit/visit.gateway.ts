import { Logger } from '@nestjs/common';
import { type OnGatewayConnection, type OnGatewayInit, WebSocketGateway, WebSocketServer } from '@nestjs/websockets';
import type { Socket } from 'socket.io';
import type { VisitServerToClientEvents } from '@crankjournal/shared-types';
import { boardRoom, VisitService, type VisitNamespace } from './visit.service.js';
import { VisitRateLimit } from './visit-rate-limit.guard.js';

type VisitSocket = Socket<Record<string, never>, VisitServerToClientEvents, Record<string, never>, { boardId: string }>;

/**
 * The public namespace /visit: a visitor connects with the board's slug (handshake `auth.slug`) and only ever
 * receives that board's figures. No sign-in, no rooms to join, no events accepted: anything sent is refused.
 * It is a namespace of its own, so the crew's rooms (site, run:…, engine:…) and events do not exist here.
 */
@WebSocketGateway({ namespace: '/visit', cors: { origin: false } })
export class VisitGateway implements OnGatewayInit, OnGatewayConnection {
  private readonly logger = new Logger('Visit');
  @WebSocketServer() server: VisitNamespace;

  constructor(
    private readonly visit: VisitService,
    private readonly limit: VisitRateLimit,
  ) {}

  afterInit(server: VisitNamespace) {
    this.visit.attach(server);
    server.use(async (socket, next) => {
      try {
        const wait = await this.limit.take(socket.handshake.address);
        if (wait) return next(new Error(`Too many connections from your network. Try again in ${wait} seconds.`));
        const board = await this.visit.enabledBoard((socket.handshake.auth as { slug?: unknown })?.slug);
        if (!board) return next(new Error('There is no visitor board at this address, or it has been switched off.'));
        if (this.visit.viewersEverywhere(board.id) >= this.visit.viewerCap)
          return next(new Error('This board has as many visitors as it can take just now. Try again in a minute.'));
        socket.data.boardId = board.id;
        await socket.join(boardRoom(board.id));
        next();
      } catch (e) {
        this.logger.warn(`visitor not connected: ${(e as Error).message}`);
        next(new Error('The board could not be opened just now. Try again in a minute.'));
      }
    });
  }

  async handleConnection(socket: VisitSocket) {
    // Nothing is accepted from a visitor: every event is refused (and acknowledged as refused when it asks).
    socket.onAny((event: string, ...args: unknown[]) => {
      const message = 'The visitor board is read only: it accepts no events.';
      socket.emit('visit:refused', { event: String(event).slice(0, 60), message, status: 405 });
      const ack = args.find((a) => typeof a === 'function') as ((r: unknown) => void) | undefined;
      ack?.({ ok: false, status: 405, error: message });
    });
    // The figures at once, then every few seconds with everyone else watching the board.
    const figures = await this.visit.figuresOfBoard(socket.data.boardId).catch(() => null);
    if (figures && socket.connected) socket.emit('visit:figures', figures);
  }
}
