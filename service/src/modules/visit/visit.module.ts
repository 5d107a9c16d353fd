import { Module } from '@nestjs/common';
import { TypeOrmModule } from '@nestjs/typeorm';
import { RunsModule } from '../runs/runs.module.js';
import { EnginesModule } from '../engines/engines.module.js';
import { AlarmsModule } from '../alarms/alarms.module.js';
import { IndicatorCardsModule } from '../indicator-cards/indicator-cards.module.js';
import { StorageModule } from '../storage/storage.module.js';
import { VisitorBoard } from './visitor-board.entity.js';
import { VisitService } from './visit.service.js';
import { VisitGateway } from './visit.gateway.js';
import { VisitRateLimit, VisitRateLimitGuard } from './visit-rate-limit.guard.js';
import { VisitorBoardsController } from './visitor-boards.controller.js';
import { VisitController } from './visit.controller.js';

/** Visitor boards: the public, read-only window on an engine at work (routes /api/visit, socket namespace /visit). */
@Module({
  imports: [TypeOrmModule.forFeature([VisitorBoard]), RunsModule, EnginesModule, AlarmsModule, IndicatorCardsModule, StorageModule],
  providers: [VisitService, VisitGateway, VisitRateLimit, VisitRateLimitGuard],
  controllers: [VisitorBoardsController, VisitController],
  exports: [VisitService],
})
export class VisitModule {}
