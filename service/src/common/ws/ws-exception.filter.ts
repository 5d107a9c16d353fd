import { ArgumentsHost, Catch, HttpException, Logger } from '@nestjs/common';
import { BaseWsExceptionFilter, WsException } from '@nestjs/websockets';
import type { Socket } from 'socket.io';

/** Every failed socket event answers with `live:error` (and the ack, when one was given); never a crash. */
@Catch()
export class WsErrorFilter extends BaseWsExceptionFilter {
  private readonly logger = new Logger('Live');
  catch(exception: unknown, host: ArgumentsHost) {
    const ws = host.switchToWs();
    const client = ws.getClient<Socket>();
    const args = host.getArgs();
    // Nest passes (client, data, ack?, pattern): the ack is not always the last argument.
    const ack = args.find((a, i) => i > 0 && typeof a === 'function') as ((r: unknown) => void) | undefined;
    let message: string | string[];
    let status = 400;
    if (exception instanceof WsException) {
      const e = exception.getError();
      message =
        typeof e === 'string' || Array.isArray(e) ? (e as string | string[]) : String((e as { message?: string }).message ?? 'Refused.');
    } else if (exception instanceof HttpException) {
      status = exception.getStatus();
      const r = exception.getResponse();
      message = typeof r === 'string' ? r : ((r as { message?: string | string[] }).message ?? exception.message);
    } else {
      this.logger.error('socket event failed', exception instanceof Error ? exception.stack : String(exception));
      status = 500;
      message = 'Something went wrong on the server. It has been logged.';
    }
    const event = (ws.getPattern?.() as string | undefined) ?? 'unknown';
    client.emit('live:error', { event, message, status });
    if (ack) ack({ ok: false, error: Array.isArray(message) ? message.join('; ') : message, status });
  }
}
