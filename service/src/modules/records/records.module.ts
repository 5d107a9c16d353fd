import { Module } from '@nestjs/common';
import { RunsModule } from '../runs/runs.module.js';
import { EnginesModule } from '../engines/engines.module.js';
import { AlarmsModule } from '../alarms/alarms.module.js';
import { ChecklistsModule } from '../checklists/checklists.module.js';
import { IndicatorCardsModule } from '../indicator-cards/indicator-cards.module.js';
import { SiteModule } from '../site/site.module.js';
import { RunLogSheetService } from './run-log-sheet.service.js';
import { RecordsController } from './records.controller.js';

/** Printed records that gather from several modules; each is a document description on common/pdf. */
@Module({
  imports: [RunsModule, EnginesModule, AlarmsModule, ChecklistsModule, IndicatorCardsModule, SiteModule],
  providers: [RunLogSheetService],
  controllers: [RecordsController],
  exports: [RunLogSheetService],
})
export class RecordsModule {}
