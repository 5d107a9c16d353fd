import { Logger, UseFilters, UsePipes } from '@nestjs/common';
import { JwtService } from '@nestjs/jwt';
import { ConnectedSocket, MessageBody, OnGatewayInit, SubscribeMessage, WebSocketGateway, WebSocketServer } from '@nestjs/websockets';
import type { JoinRoomAck } from '@crankjournal/shared-types';
import { UsersService } from '../users/users.service.js';
import { wsValidationPipe } from '../../common/ws/ws-validation.pipe.js';
import { WsErrorFilter } from '../../common/ws/ws-exception.filter.js';
import type { LiveServer, LiveSocket } from '../../common/ws/live-socket.js';
import { canJoinRoom } from './room-rules.js';
import { JoinRoomDto } from './dto/join-room.dto.js';
import { LiveService } from './live.service.js';

export type { LiveServer, LiveSocket };

/** The live channel. A connection needs a valid access token (handshake `auth.token`); rooms follow ROOM_RULES. */
@WebSocketGateway({ cors: { origin: false } })
@UsePipes(wsValidationPipe)
@UseFilters(new WsErrorFilter())
export class LiveGateway implements OnGatewayInit {
  private readonly logger = new Logger('Live');
  @WebSocketServer() server: LiveServer;

  constructor(
    private readonly jwt: JwtService,
    private readonly users: UsersService,
    private readonly live: LiveService,
  ) {}

  afterInit(server: LiveServer) {
    this.live.attach(server);
    server.use(async (socket, next) => {
      try {
        const token = (socket.handshake.auth as { token?: unknown })?.token;
        if (typeof token !== 'string' || !token) return next(new Error('Sign in first: the live channel needs an access token.'));
        const payload = await this.jwt.verifyAsync<{ sub: string; sv?: number }>(token, { algorithms: ['HS256'] });
        const user = await this.users.currentSessionUser(payload.sub, payload.sv);
        if (!user) return next(new Error('Your account is not active, or this sign-in has ended. Sign in again.'));
        socket.data.user = user;
        await socket.join(['site', `user:${user.id}`]);
        next();
      } catch {
        next(new Error('Your sign-in has expired or is not valid. Sign in again.'));
      }
    });
  }

  @SubscribeMessage('room:join')
  async join(@ConnectedSocket() socket: LiveSocket, @MessageBody() body: JoinRoomDto): Promise<JoinRoomAck> {
    const user = await this.users.socketUser(socket);
    const verdict = canJoinRoom(user.role, body.room);
    if (!verdict.ok) {
      socket.emit('live:error', { event: 'room:join', message: verdict.reason, status: verdict.status });
      return { ok: false, error: verdict.reason, status: verdict.status };
    }
    await socket.join(body.room);
    return { ok: true, room: body.room };
  }

  @SubscribeMessage('room:leave')
  async leave(@ConnectedSocket() socket: LiveSocket, @MessageBody() body: JoinRoomDto): Promise<JoinRoomAck> {
    await socket.leave(body.room);
    return { ok: true, room: body.room };
  }
}
