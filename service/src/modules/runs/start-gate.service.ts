import { Injectable } from '@nestjs/common';
import type { StartGateReason, StartGateVerdict } from '@crankjournal/shared-types';
import type { AuthUser } from '../../common/decorators/current-user.decorator.js';
import { AlarmsService } from '../alarms/alarms.service.js';
import type { Run } from './run.entity.js';

/** A rule of the start (or close) gate. Feature modules (checklists, qualifications) register theirs. */
export interface GateRule {
  name: string;
  check(run: Run, user: AuthUser): Promise<{ reasons: StartGateReason[]; preLubeFreshUntil?: string | null }>;
}

/**
 * The one place that decides whether a run may start (and, after a stop, close). Every route that can
 * start a run goes through RunsService.transition, which asks this service; there is no other path.
 */
@Injectable()
export class StartGateService {
  private readonly startRules: GateRule[] = [];
  private readonly closeRules: GateRule[] = [];

  constructor(private readonly alarms: AlarmsService) {
    this.startRules.push({
      name: 'no-high-high-alarm',
      check: async (run) => {
        const unresolved = await this.alarms.unresolvedHighHigh(run.engineId);
        return {
          reasons: unresolved.map((a) => ({
            code: 'active_high_high_alarm',
            message: a.conditionActive
              ? `A high-high alarm is active on this engine: ${a.message} Clear its cause first.`
              : `A high-high alarm on this engine has returned to normal but nobody has acknowledged it yet: ${a.message} ` +
                'A person qualified to answer alarms must acknowledge it first.',
            subject: a.id,
          })),
        };
      },
    });
  }

  registerStartRule(rule: GateRule) {
    this.startRules.push(rule);
  }
  registerCloseRule(rule: GateRule) {
    this.closeRules.push(rule);
  }

  private async run(rules: GateRule[], run: Run, user: AuthUser): Promise<StartGateVerdict> {
    const results = await Promise.all(rules.map((r) => r.check(run, user)));
    const reasons = results.flatMap((r) => r.reasons);
    const fresh = results.map((r) => r.preLubeFreshUntil).find((x) => x !== undefined) ?? null;
    return { allowed: reasons.length === 0, reasons, preLubeFreshUntil: fresh };
  }

  checkStart(run: Run, user: AuthUser): Promise<StartGateVerdict> {
    return this.run(this.startRules, run, user);
  }
  checkClose(run: Run, user: AuthUser): Promise<StartGateVerdict> {
    return this.run(this.closeRules, run, user);
  }
}
