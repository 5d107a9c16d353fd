import { Injectable, NotFoundException } from '@nestjs/common';
import type { EngineDetail, EngineSummary } from '@crankjournal/shared-types';
import { EnginesService, type EngineWithPoints } from '../engines/engines.service.js';
import { RunsService, type RunOutline } from '../runs/runs.service.js';
import { UsersService } from '../users/users.service.js';

/** A measurement point of an engine, as EnginesService hands it over. */
export type MeasurementPoint = EngineWithPoints['points'][number];

export interface Counters {
  runHours: number;
  revolutions: number;
}

/** Running hours per calendar day and revolutions per day are averaged over this many days before now. */
export const USAGE_WINDOW_DAYS = 365;

/**
 * What the maintenance area needs to know about engines, their runs and people, through the other areas'
 * services: counters now and at a past date, usage rates, which engine a bearing belongs to, names.
 */
@Injectable()
export class EngineFactsService {
  constructor(
    private readonly engines: EnginesService,
    private readonly runs: RunsService,
    private readonly users: UsersService,
  ) {}

  async summary(engineId: string): Promise<EngineSummary> {
    const e = await this.engines.get(engineId);
    return this.engines.summary(e);
  }

  detail(engineId: string): Promise<EngineDetail> {
    return this.engines.detail(engineId);
  }

  /** The active bearings of each engine (id, label, kind), in position order, in one read. */
  activeBearings(
    engineIds: string[],
  ): Promise<Map<string, { id: string; label: string; kind: EngineDetail['bearings'][number]['kind'] }[]>> {
    return this.engines.activeBearings(engineIds);
  }

  /** Every measurement point of the engine, retired ones included (their readings stay in the record). */
  async allPoints(engineId: string): Promise<MeasurementPoint[]> {
    return (await this.engines.withPoints(engineId)).points;
  }

  async engineNames(): Promise<Map<string, string>> {
    return new Map((await this.engines.list()).map((e) => [e.id, e.name]));
  }

  /** The engine that has this bearing, and the bearing. 404 when no engine has it. */
  async bearing(bearingId: string): Promise<{ engine: EngineDetail; bearing: EngineDetail['bearings'][number] }> {
    const engines = await this.engines.list();
    // Most bearings have a temperature point: the engines' points are cached, so look there first.
    const order = [...engines];
    for (const e of engines) {
      const { points } = await this.engines.withPoints(e.id);
      if (points.some((p) => p.bearingId === bearingId)) {
        order.splice(order.indexOf(e), 1);
        order.unshift(e);
        break;
      }
    }
    for (const e of order) {
      const d = await this.engines.detail(e.id);
      const b = d.bearings.find((x) => x.id === bearingId);
      if (b) return { engine: d, bearing: b };
    }
    throw new NotFoundException('No such bearing.');
  }

  /** Runs of an engine that have started, oldest first (their own columns only). */
  startedRuns(engineId: string): Promise<RunOutline[]> {
    return this.runs.startedOutlines(engineId);
  }

  /** The engine's counters now (baseline + runs recorded). */
  async counters(engineId: string): Promise<Counters> {
    const s = await this.summary(engineId);
    return { runHours: s.runningHours, revolutions: s.revolutions };
  }

  /**
   * The engine's counters at a past moment: today's totals less the runs that stopped after it (a run's hours
   * and revolutions are added to the engine when it stops).
   */
  async countersAt(engineId: string, at: Date): Promise<Counters> {
    const now = await this.counters(engineId);
    const runs = await this.runs.list({ engineId });
    let runHours = now.runHours;
    let revolutions = now.revolutions;
    for (const r of runs) {
      if (!r.stoppedAt || new Date(r.stoppedAt) <= at) continue;
      runHours -= r.runningSeconds / 3600;
      revolutions -= r.revolutions;
    }
    return { runHours: Math.max(0, runHours), revolutions: Math.max(0, revolutions) };
  }

  /** Average running hours and revolutions per calendar day over the last year, for estimated due dates. */
  async usageRates(engineId: string, now = new Date()): Promise<{ runHoursPerDay: number; revolutionsPerDay: number }> {
    const since = now.getTime() - USAGE_WINDOW_DAYS * 86_400_000;
    const runs = await this.runs.list({ engineId });
    let hours = 0;
    let revs = 0;
    for (const r of runs) {
      if (!r.stoppedAt || new Date(r.stoppedAt).getTime() < since) continue;
      hours += r.runningSeconds / 3600;
      revs += r.revolutions;
    }
    return { runHoursPerDay: hours / USAGE_WINDOW_DAYS, revolutionsPerDay: revs / USAGE_WINDOW_DAYS };
  }

  async userNames(): Promise<Map<string, string>> {
    return new Map((await this.users.list()).map((u) => [u.id, u.displayName]));
  }
}
