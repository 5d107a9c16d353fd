import { Module } from '@nestjs/common';
import { TypeOrmModule } from '@nestjs/typeorm';
import { MulterModule } from '@nestjs/platform-express';
import { EnginesModule } from '../engines/engines.module.js';
import { RunsModule } from '../runs/runs.module.js';
import { AlarmsModule } from '../alarms/alarms.module.js';
import { UsersModule } from '../users/users.module.js';
import { IndicatorCardsModule } from '../indicator-cards/indicator-cards.module.js';
import { StorageModule } from '../storage/storage.module.js';
import { AppConfig } from '../../config/app-config.service.js';
import { SiteModule } from '../site/site.module.js';
import { InspectionPlan } from './inspection-plan.entity.js';
import { Inspection, InspectionAttachment, InspectionMeasurement } from './inspection.entity.js';
import { WorkRecord } from './work-record.entity.js';
import { RunPointStat } from './run-point-stat.entity.js';
import { EngineFactsService } from './engine-facts.service.js';
import { PlansService } from './plans.service.js';
import { InspectionsService } from './inspections.service.js';
import { WorkRecordsService } from './work-records.service.js';
import { RunStatsService } from './run-stats.service.js';
import { MaintenanceIndicatedPowerSource } from './maintenance-indicated-power.source.js';
import { BearingHistoryService } from './bearing-history.service.js';
import { BearingHistoryExportsService } from './bearing-history-exports.service.js';
import { MaintenanceController } from './maintenance.controller.js';

/** Maintenance: bearing histories and drift, inspection plans and what is due, inspections, work records. */
@Module({
  imports: [
    SiteModule,
    TypeOrmModule.forFeature([InspectionPlan, Inspection, InspectionMeasurement, InspectionAttachment, WorkRecord, RunPointStat]),
    // Uploads are held in memory (multer's default without a destination; they go straight on to the object
    // store), at most UPLOAD_MAX_BYTES each.
    MulterModule.registerAsync({
      inject: [AppConfig],
      useFactory: (c: AppConfig) => ({ limits: { fileSize: c.get('UPLOAD_MAX_BYTES'), files: 1, fields: 10 } }),
    }),
    EnginesModule,
    RunsModule,
    AlarmsModule,
    UsersModule,
    IndicatorCardsModule,
    StorageModule,
  ],
  providers: [
    EngineFactsService,
    PlansService,
    InspectionsService,
    WorkRecordsService,
    RunStatsService,
    MaintenanceIndicatedPowerSource,
    BearingHistoryService,
    BearingHistoryExportsService,
  ],
  controllers: [MaintenanceController],
  exports: [PlansService, BearingHistoryService, RunStatsService],
})
export class MaintenanceModule {}
