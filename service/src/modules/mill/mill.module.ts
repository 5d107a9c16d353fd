import { Module } from '@nestjs/common';
import { TypeOrmModule } from '@nestjs/typeorm';
import { EnginesModule } from '../engines/engines.module.js';
import { RunsModule } from '../runs/runs.module.js';
import { AlarmsModule } from '../alarms/alarms.module.js';
import { IndicatorCardsModule } from '../indicator-cards/indicator-cards.module.js';
import { MailModule } from '../mail/mail.module.js';
import { LiveModule } from '../live/live.module.js';
import { UsersModule } from '../users/users.module.js';
import { SiteModule } from '../site/site.module.js';
import { Mill } from './mill.entity.js';
import { MillStand } from './mill-stand.entity.js';
import { PassSchedule } from './pass-schedule.entity.js';
import { SchedulePass } from './schedule-pass.entity.js';
import { MillBar } from './mill-bar.entity.js';
import { MillPass } from './mill-pass.entity.js';
import { CustomerLot } from './customer-lot.entity.js';
import { LotStatusChange } from './lot-status-change.entity.js';
import { LotRun } from './lot-run.entity.js';
import { LotQuote } from './lot-quote.entity.js';
import { MillService } from './mill.service.js';
import { SchedulesService } from './schedules.service.js';
import { RollingLogService } from './rolling-log.service.js';
import { LotsService } from './lots.service.js';
import { QuotePdfService } from './quote-pdf.service.js';
import { MillIndicatedPowerSource } from './mill-indicated-power.source.js';
import { MillController } from './mill.controller.js';
import { RollingLogController } from './rolling-log.controller.js';
import { LotsController } from './lots.controller.js';
import { MillCalculationsController } from './mill-calculations.controller.js';

/** The mill: stands and settings, pass schedules, the rolling log of runs, customer lots and quotes. */
@Module({
  imports: [
    SiteModule,
    TypeOrmModule.forFeature([
      Mill,
      MillStand,
      PassSchedule,
      SchedulePass,
      MillBar,
      MillPass,
      CustomerLot,
      LotStatusChange,
      LotRun,
      LotQuote,
    ]),
    EnginesModule,
    RunsModule,
    AlarmsModule,
    IndicatorCardsModule,
    MailModule,
    LiveModule,
    UsersModule,
  ],
  providers: [MillService, SchedulesService, RollingLogService, LotsService, QuotePdfService, MillIndicatedPowerSource],
  controllers: [MillController, RollingLogController, LotsController, MillCalculationsController],
  exports: [MillService, SchedulesService, RollingLogService, LotsService],
})
export class MillModule {}
