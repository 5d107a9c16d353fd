import { Module } from '@nestjs/common';
import { TypeOrmModule } from '@nestjs/typeorm';
import { ClusterModule } from '../cluster/cluster.module.js';
import { EnginesModule } from '../engines/engines.module.js';
import { AlarmsModule } from '../alarms/alarms.module.js';
import { LiveModule } from '../live/live.module.js';
import { AuthModule } from '../auth/auth.module.js';
import { UsersModule } from '../users/users.module.js';
import { Run } from './run.entity.js';
import { RunStateChange } from './run-state-change.entity.js';
import { Reading } from './reading.entity.js';
import { ReadingAmendment } from './reading-amendment.entity.js';
import { DataLogger } from './logger.entity.js';
import { RunsService } from './runs.service.js';
import { StartGateService } from './start-gate.service.js';
import { IngestService } from './ingest.service.js';
import { ReadingsService } from './readings.service.js';
import { CsvImportService } from './csv-import.service.js';
import { LoggersService } from './loggers.service.js';
import { RunExportsService } from './run-exports.service.js';
import { RunsController } from './runs.controller.js';
import { ReadingsController } from './readings.controller.js';
import { LoggersController } from './loggers.controller.js';
import { LoggerKeyGuard } from './logger-key.guard.js';
import { RunsGateway } from './runs.gateway.js';

/** The run log: runs and their states, readings from every source, loggers, exports. */
@Module({
  imports: [
    TypeOrmModule.forFeature([Run, RunStateChange, Reading, ReadingAmendment, DataLogger]),
    EnginesModule,
    AlarmsModule,
    LiveModule,
    AuthModule,
    UsersModule,
    ClusterModule,
  ],
  providers: [
    RunsService,
    StartGateService,
    IngestService,
    ReadingsService,
    CsvImportService,
    LoggersService,
    RunExportsService,
    LoggerKeyGuard,
    RunsGateway,
  ],
  controllers: [RunsController, ReadingsController, LoggersController],
  exports: [RunsService, StartGateService, ReadingsService, IngestService],
})
export class RunsModule {}
