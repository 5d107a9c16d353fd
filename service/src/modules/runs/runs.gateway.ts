import { UseFilters, UsePipes, ForbiddenException, HttpException } from '@nestjs/common';
import { ConnectedSocket, MessageBody, SubscribeMessage, WebSocketGateway } from '@nestjs/websockets';
import { IsArray, IsObject, IsUUID, ArrayMinSize, ArrayMaxSize } from 'class-validator';
import type { IngestResult, LiveAck, Role, RunDetail, StartGateVerdict } from '@crankjournal/shared-types';
import { wsValidationPipe } from '../../common/ws/ws-validation.pipe.js';
import { WsErrorFilter } from '../../common/ws/ws-exception.filter.js';
import type { LiveSocket } from '../../common/ws/live-socket.js';
import type { AuthUser } from '../../common/decorators/current-user.decorator.js';
import { UsersService } from '../users/users.service.js';
import { IngestService } from './ingest.service.js';
import { RunsService } from './runs.service.js';

export class SubmitReadingsDto {
  @IsUUID('all', { message: 'runId must be a UUID' }) runId: string;
  @IsArray({ message: 'readings must be a list' })
  @ArrayMinSize(1)
  @ArrayMaxSize(5000)
  @IsObject({ each: true, message: 'each reading must be an object' })
  readings: Record<string, unknown>[];
}
export class StartRunDto {
  @IsUUID('all', { message: 'runId must be a UUID' }) runId: string;
}

/** Who may send each socket event (the roles matrix test reads this table). */
export const SOCKET_EVENT_ROLES: Record<string, readonly Role[]> = {
  'readings:submit': ['operator', 'chief_engineer'],
  'run:start': ['operator', 'chief_engineer'],
};

/** The sender as they are now (session and role checked again, like every HTTP request), if their role may send `event`. */
async function allowedSender(users: UsersService, socket: LiveSocket, event: string): Promise<AuthUser> {
  const user = await users.socketUser(socket);
  // 403 like the HTTP edge (WsErrorFilter answers an HttpException with its status).
  if (!SOCKET_EVENT_ROLES[event].includes(user.role)) throw new ForbiddenException(`Your role may not send ${event}.`);
  return user;
}

/** Run-log events on the live channel; they take the same paths as the REST routes. */
@WebSocketGateway({ cors: { origin: false } })
@UsePipes(wsValidationPipe)
@UseFilters(new WsErrorFilter())
export class RunsGateway {
  constructor(
    private readonly ingest: IngestService,
    private readonly runs: RunsService,
    private readonly users: UsersService,
  ) {}

  @SubscribeMessage('readings:submit')
  async submit(@ConnectedSocket() socket: LiveSocket, @MessageBody() body: SubmitReadingsDto): Promise<LiveAck<IngestResult>> {
    const me = await allowedSender(this.users, socket, 'readings:submit');
    const run = await this.runs.forReadings(body.runId);
    const r = await this.ingest.ingest({ run, source: 'live', enteredBy: me.id }, body.readings);
    if (r.rejectedCount) {
      socket.emit('live:error', {
        event: 'readings:submit',
        message: r.rejected.slice(0, 20).map((x) => `reading ${x.index}: ${x.reason}`),
        status: 400,
      });
      return { ok: false, status: 400, error: 'Some readings were refused.', data: r };
    }
    return { ok: true, data: r };
  }

  /** Starting from the live channel asks the same start gate as the REST route. */
  @SubscribeMessage('run:start')
  async start(@ConnectedSocket() socket: LiveSocket, @MessageBody() body: StartRunDto): Promise<LiveAck<RunDetail | StartGateVerdict>> {
    const me = await allowedSender(this.users, socket, 'run:start');
    try {
      return { ok: true, data: await this.runs.transition(body.runId, { to: 'running' }, me) };
    } catch (e) {
      if (e instanceof HttpException && e.getStatus() === 409) {
        // A refused start gate answers a list of reasons; a refused state change (ConflictException) one sentence.
        const r = e.getResponse() as { message?: string | string[]; details?: StartGateVerdict };
        return { ok: false, status: 409, error: [r.message ?? []].flat().join(' ') || 'Refused.', data: r.details, details: r.details };
      }
      throw e;
    }
  }
}
