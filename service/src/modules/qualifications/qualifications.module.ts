import { Module, type OnModuleInit } from '@nestjs/common';
import { TypeOrmModule } from '@nestjs/typeorm';
import { ALARM_DUTY, START_DUTY } from '@crankjournal/shared-types';
import { EnginesModule } from '../engines/engines.module.js';
import { EnginesService } from '../engines/engines.service.js';
import { RunsModule } from '../runs/runs.module.js';
import { StartGateService } from '../runs/start-gate.service.js';
import { UsersModule } from '../users/users.module.js';
import { AlarmsModule } from '../alarms/alarms.module.js';
import { AlarmsService } from '../alarms/alarms.service.js';
import { starterReason } from './qualification-rules.js';
import { QualificationsController } from './qualifications.controller.js';
import { QualificationsService } from './qualifications.service.js';
import { Qualification } from './qualification.entity.js';

/**
 * Crew qualifications per person, engine and duty. Registers two checks at start-up: the start gate's
 * "the person starting holds a current start-and-run qualification", and the alarms' acknowledgement
 * policy (acknowledge, shelve, unshelve need the same duty on the alarm's engine). Nobody is exempt.
 */
@Module({
  imports: [TypeOrmModule.forFeature([Qualification]), EnginesModule, RunsModule, AlarmsModule, UsersModule],
  providers: [QualificationsService],
  controllers: [QualificationsController],
  exports: [QualificationsService],
})
export class QualificationsModule implements OnModuleInit {
  constructor(
    private readonly quals: QualificationsService,
    private readonly gate: StartGateService,
    private readonly alarms: AlarmsService,
    private readonly engines: EnginesService,
  ) {}

  onModuleInit() {
    this.gate.registerStartRule({
      name: 'starter-qualified',
      check: async (run, user) => {
        const finding = await this.quals.finding(user.id, run.engineId, START_DUTY);
        const engine = await this.engines.get(run.engineId);
        const reason = starterReason(finding, START_DUTY, engine.name);
        return { reasons: reason ? [reason] : [] };
      },
    });
    this.alarms.setAckPolicy({
      assertMayAcknowledge: async (user, alarm) => {
        await this.quals.assertQualified(user, alarm.engineId, ALARM_DUTY, 'answer alarms on this engine');
      },
    });
  }
}
