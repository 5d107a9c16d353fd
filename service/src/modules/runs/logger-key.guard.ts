import { CanActivate, ExecutionContext, Injectable } from '@nestjs/common';
import { LoggersService } from './loggers.service.js';

/** Routes for data loggers: authenticated by the logger's own key, never by a user token. */
@Injectable()
export class LoggerKeyGuard implements CanActivate {
  constructor(private readonly loggers: LoggersService) {}
  async canActivate(ctx: ExecutionContext): Promise<boolean> {
    const req = ctx.switchToHttp().getRequest<{ headers: Record<string, unknown>; logger?: unknown }>();
    req.logger = await this.loggers.authenticate(req.headers['x-logger-key']);
    return true;
  }
}
