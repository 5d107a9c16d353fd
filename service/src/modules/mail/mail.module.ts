import { Module } from '@nestjs/common';
import { JobsModule } from '../jobs/jobs.module.js';
import { MailController } from './mail.controller.js';
import { MailService } from './mail.service.js';

@Module({ imports: [JobsModule], providers: [MailService], controllers: [MailController], exports: [MailService] })
export class MailModule {}
