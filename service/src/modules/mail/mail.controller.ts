import { Controller, Get } from '@nestjs/common';
import { ApiBearerAuth, ApiTags } from '@nestjs/swagger';
import type { MailJobDto } from '@crankjournal/shared-types';
import { Roles } from '../../common/decorators/roles.decorator.js';
import { ApiAnswer } from '../../common/openapi/api-answer.decorator.js';
import { MailService } from './mail.service.js';

@ApiTags('mail')
@ApiBearerAuth()
@Controller('mail')
export class MailController {
  constructor(private readonly mail: MailService) {}

  /** The latest 100 e-mails of the queue, newest first: waiting, between tries, sent or failed, with their tries. */
  @ApiAnswer('MailJobDto', { array: true })
  @Get('jobs')
  @Roles('administrator')
  jobs(): Promise<MailJobDto[]> {
    return this.mail.jobList(100);
  }
}
