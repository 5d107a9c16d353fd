import { Module } from '@nestjs/common';
import { TypeOrmModule } from '@nestjs/typeorm';
import { EnginesModule } from '../engines/engines.module.js';
import { UsersModule } from '../users/users.module.js';
import { LiveModule } from '../live/live.module.js';
import { MailModule } from '../mail/mail.module.js';
import { JobsModule } from '../jobs/jobs.module.js';
import { Alarm } from './alarm.entity.js';
import { AlarmEvent } from './alarm-event.entity.js';
import { AlarmsService } from './alarms.service.js';
import { AlarmsController } from './alarms.controller.js';

@Module({
  imports: [TypeOrmModule.forFeature([Alarm, AlarmEvent]), EnginesModule, UsersModule, LiveModule, MailModule, JobsModule],
  providers: [AlarmsService],
  controllers: [AlarmsController],
  exports: [AlarmsService],
})
export class AlarmsModule {}
