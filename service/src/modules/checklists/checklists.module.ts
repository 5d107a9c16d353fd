import { Module, type OnModuleInit } from '@nestjs/common';
import { TypeOrmModule } from '@nestjs/typeorm';
import { EnginesModule } from '../engines/engines.module.js';
import { RunsModule } from '../runs/runs.module.js';
import { StartGateService } from '../runs/start-gate.service.js';
import { UsersModule } from '../users/users.module.js';
import { QualificationsModule } from '../qualifications/qualifications.module.js';
import { AuthModule } from '../auth/auth.module.js';
import { StorageModule } from '../storage/storage.module.js';
import { LiveModule } from '../live/live.module.js';
import { SiteModule } from '../site/site.module.js';
import { ChecklistTemplate, ChecklistTemplateVersion } from './checklist-template.entity.js';
import { Checklist, ChecklistAmendment, ChecklistEntry } from './checklist.entity.js';
import { ChecklistTemplatesService } from './checklist-templates.service.js';
import { ChecklistsService } from './checklists.service.js';
import { ChecklistPdfService } from './checklist-pdf.service.js';
import { ChecklistTemplatesController } from './checklist-templates.controller.js';
import { ChecklistsController } from './checklists.controller.js';

/**
 * Checklist templates (versioned) and a run's checklists. Registers the start gate's checklist rule
 * (required checklists signed by people still qualified, pre-lube fresh) and the close rule (shutdown
 * checklists signed); clears a preparing run once its pre-start checklists are all signed.
 */
@Module({
  imports: [
    SiteModule,
    TypeOrmModule.forFeature([ChecklistTemplate, ChecklistTemplateVersion, Checklist, ChecklistEntry, ChecklistAmendment]),
    EnginesModule,
    RunsModule,
    QualificationsModule,
    AuthModule,
    StorageModule,
    LiveModule,
    UsersModule,
  ],
  providers: [ChecklistTemplatesService, ChecklistsService, ChecklistPdfService],
  controllers: [ChecklistTemplatesController, ChecklistsController],
  exports: [ChecklistTemplatesService, ChecklistsService],
})
export class ChecklistsModule implements OnModuleInit {
  constructor(
    private readonly gate: StartGateService,
    private readonly checklists: ChecklistsService,
  ) {}

  onModuleInit() {
    this.gate.registerStartRule({ name: 'checklists-signed-and-pre-lube-fresh', check: (run) => this.checklists.startRule(run) });
    this.gate.registerCloseRule({ name: 'shutdown-checklists-signed', check: (run) => this.checklists.closeRule(run) });
  }
}
