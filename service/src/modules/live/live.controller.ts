import { Body, Controller, HttpCode, Post } from '@nestjs/common';
import { ApiBearerAuth, ApiTags } from '@nestjs/swagger';
import { Roles } from '../../common/decorators/roles.decorator.js';
import { CurrentUser, type AuthUser } from '../../common/decorators/current-user.decorator.js';
import { ApiAnswerSchema } from '../../common/openapi/api-answer.decorator.js';
import { LiveService } from './live.service.js';
import { SiteNoticeDto } from './dto/site-notice.dto.js';

@ApiTags('live')
@ApiBearerAuth()
@Controller('live')
export class LiveController {
  constructor(private readonly live: LiveService) {}

  /** A notice to everyone signed in (for example "engine house closes at four"). */
  @ApiAnswerSchema({ type: 'object', properties: { delivered: { const: true } }, required: ['delivered'] }, 'The notice went out')
  @Post('notices')
  @HttpCode(202)
  @Roles('administrator', 'chief_engineer')
  notice(@Body() dto: SiteNoticeDto, @CurrentUser() me: AuthUser): { delivered: true } {
    this.live.emitToRoom('site', 'site:notice', { message: dto.message, from: me.displayName, at: new Date().toISOString() });
    return { delivered: true };
  }
}
