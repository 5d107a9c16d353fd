import { Module } from '@nestjs/common';
import { JobsService } from './jobs.service.js';

/** The durable job queue on PostgreSQL (e-mail, escalations). */
@Module({ providers: [JobsService], exports: [JobsService] })
export class JobsModule {}
