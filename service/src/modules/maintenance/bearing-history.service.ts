import { Injectable } from '@nestjs/common';
import type {
  AlarmDto,
  BearingHistory,
  BearingListItem,
  BearingRunRow,
  DriftBandDto,
  LoadMeasure,
  TimelineEntry,
} from '@crankjournal/shared-types';
import { AlarmsService } from '../alarms/alarms.service.js';
import type { PointRunStat } from '../runs/readings.service.js';
import type { RunOutline } from '../runs/runs.service.js';
import {
  DEFAULT_BAND_CONFIDENCE,
  MIN_RUNS_TO_JUDGE,
  bandAt,
  driftHistory,
  driftRuleText,
  fitBand,
  type DriftBand,
} from '../../calculations/bearing-drift.js';
import { celsiusToFahrenheit } from '../../calculations/units.js';
import { EngineFactsService, type MeasurementPoint } from './engine-facts.service.js';
import { InspectionsService } from './inspections.service.js';
import { WorkRecordsService } from './work-records.service.js';
import { RunStatsService } from './run-stats.service.js';
import { MaintenanceIndicatedPowerSource } from './maintenance-indicated-power.source.js';

/** Coverage of the prediction interval (the band) and the margin above it (°F of rise) that flags drift. */
export const DRIFT_SETTINGS = { confidence: DEFAULT_BAND_CONFIDENCE, marginF: 5 } as const;
/**
 * Below these spreads the earlier runs count as "at comparable load", so the band is about the mean rise rather
 * than a slope fitted to scatter: a mill engine runs at its governed speed, so mean speeds within 5 rpm are the
 * same running; indicated power within 50 hp likewise (the product's own settings; common practice, no source).
 */
export const MIN_LOAD_SPREAD: Record<LoadMeasure, number> = { speed_rpm: 5, indicated_hp: 50 };
const LOAD_NAME: Record<LoadMeasure, string> = { speed_rpm: 'mean speed', indicated_hp: 'indicated power' };
const LOAD_UNIT: Record<LoadMeasure, string> = { speed_rpm: 'rpm', indicated_hp: 'hp' };

/** The rule exactly as applied here: the band of bearing-drift.ts plus how the history is chosen. */
export function historyRuleText(measure: LoadMeasure): string {
  return (
    driftRuleText({
      confidence: DRIFT_SETTINGS.confidence,
      marginF: DRIFT_SETTINGS.marginF,
      minLoadSpread: MIN_LOAD_SPREAD[measure],
      loadName: LOAD_NAME[measure],
      loadUnit: LOAD_UNIT[measure],
    }) +
    ' Rise above ambient is the run\u2019s peak bearing temperature less its mean ambient temperature.' +
    ' Each run is judged against the runs before it; ' +
    'a run already flagged is left out of the band for the runs after it, so one hot run does not hide the next.'
  );
}

interface EngineContext {
  points: MeasurementPoint[];
  runs: RunOutline[];
  ihpByRun: Map<string, number>;
  ambient: MeasurementPoint[];
  speed: MeasurementPoint[];
}

/** Temperature difference in °F from a difference in the point's unit. */
const riseF = (delta: number, unit: string) => (unit === 'degC' ? (delta * 9) / 5 : delta);
/** A temperature in another unit of the same scale family. */
function toUnit(value: number, from: string, to: string): number | null {
  if (from === to) return value;
  if (from === 'degC' && to === 'degF') return celsiusToFahrenheit(value);
  if (from === 'degF' && to === 'degC') return ((value - 32) * 5) / 9;
  return null;
}

/** The band sampled for charts over the loads of every run judged (flagged ones included), with a little to spare. */
function bandDto(band: DriftBand, loads: number[]): DriftBandDto {
  const min = Math.min(band.loadMin, ...loads);
  const max = Math.max(band.loadMax, ...loads);
  const span = max - min;
  const pad = span > 0 ? span * 0.1 : Math.max(1, Math.abs(min) * 0.05);
  const lo = min - pad;
  const hi = max + pad;
  const line = Array.from({ length: 21 }, (_, i) => {
    const load = lo + ((hi - lo) * i) / 20;
    const at = bandAt(band, load);
    return { load, expectedF: at.expectedRiseF, lowerF: at.lowerF, upperF: at.upperF, limitF: at.upperF + DRIFT_SETTINGS.marginF };
  });
  return {
    kind: band.kind,
    interceptF: band.interceptF,
    slopeFPerLoad: band.slopeFPerLoad,
    residualSdF: band.residualSdF,
    confidence: band.confidence,
    degreesOfFreedom: band.degreesOfFreedom,
    tQuantile: band.tQuantile,
    marginF: DRIFT_SETTINGS.marginF,
    pointCount: band.pointCount,
    loadMin: band.loadMin,
    loadMax: band.loadMax,
    line,
  };
}

/** A bearing's runs, temperatures at load, the drift flag, and its inspections and work on one timeline. */
@Injectable()
export class BearingHistoryService {
  constructor(
    private readonly facts: EngineFactsService,
    private readonly stats: RunStatsService,
    private readonly alarms: AlarmsService,
    private readonly inspections: InspectionsService,
    private readonly work: WorkRecordsService,
    private readonly ihp: MaintenanceIndicatedPowerSource,
  ) {}

  /** What every bearing of an engine shares: its points, started runs (oldest first) and their indicated power. */
  private async engineContext(engineId: string): Promise<EngineContext> {
    const points = await this.facts.allPoints(engineId);
    const runs = (await this.facts.startedRuns(engineId)).filter((r) => r.startedAt);
    const ihpByRun = await this.ihp.meanIndicatedHpByRun(runs);
    return {
      points,
      runs,
      ihpByRun,
      ambient: points.filter((p) => p.kind === 'ambient_temperature' && (p.unit === 'degF' || p.unit === 'degC')),
      speed: points.filter((p) => p.kind === 'speed' && p.unit === 'rpm'),
    };
  }

  /** Per-run figures and alarms of some bearings' points, with the engine's ambient and speed points, in one go. */
  private async figures(
    ctx: EngineContext,
    bearingIds: string[],
    withAlarms = true,
  ): Promise<{ stats: PointRunStat[]; alarms: AlarmDto[] }> {
    const own = ctx.points.filter((p) => p.kind === 'bearing_temperature' && p.bearingId && bearingIds.includes(p.bearingId));
    const [stats, alarms] = await Promise.all([
      this.stats.stats(
        [...own, ...ctx.ambient, ...ctx.speed].map((p) => p.id),
        ctx.runs,
      ),
      withAlarms ? this.alarms.listByPoints(own.map((p) => p.id)) : Promise.resolve([]),
    ]);
    return { stats, alarms };
  }

  /** The runs of one bearing with their figures and drift verdicts (oldest first). */
  private runRows(
    ctx: EngineContext,
    bearingId: string,
    stats: PointRunStat[],
    alarms: AlarmDto[],
  ): { rows: BearingRunRow[]; measure: LoadMeasure; note: string; band: DriftBandDto | null } {
    const own = ctx.points.filter((p) => p.kind === 'bearing_temperature' && p.bearingId === bearingId);
    const ownIds = new Set(own.map((p) => p.id));
    const { ambient, speed, ihpByRun } = ctx;
    const started = ctx.runs;
    // Grouped by pushing (not by copying the list at every element: a run can hold thousands of alarm changes).
    const byRun = new Map<string, PointRunStat[]>();
    for (const s of stats) {
      const list = byRun.get(s.runId);
      if (list) list.push(s);
      else byRun.set(s.runId, [s]);
    }
    const alarmsByRun = new Map<string, AlarmDto[]>();
    for (const a of alarms) {
      if (!a.runId || !a.pointId || !ownIds.has(a.pointId)) continue;
      const list = alarmsByRun.get(a.runId);
      if (list) list.push(a);
      else alarmsByRun.set(a.runId, [a]);
    }

    const rows: BearingRunRow[] = [];
    for (const r of started) {
      const s = byRun.get(r.id) ?? [];
      // The bearing's first point (in the round's order) that has readings in this run.
      const pt = own.find((p) => s.some((x) => x.pointId === p.id));
      if (!pt) continue;
      const t = s.find((x) => x.pointId === pt.id)!;
      const amb = ambient.map((p) => ({ p, st: s.find((x) => x.pointId === p.id) })).find((x) => x.st);
      const ambientMean = amb ? toUnit(amb.st!.mean, amb.p.unit, pt.unit) : null;
      const spd = speed.map((p) => s.find((x) => x.pointId === p.id)).find((x) => x);
      rows.push({
        runId: r.id,
        title: r.title,
        startedAt: r.startedAt,
        state: r.state,
        runningHours: r.runningSeconds / 3600,
        pointCode: pt.code,
        unit: pt.unit,
        peakTemperature: t.peak,
        meanTemperature: t.mean,
        readings: t.count,
        ambientMean,
        riseAtPeakF: ambientMean !== null ? riseF(t.peak - ambientMean, pt.unit) : null,
        meanSpeedRpm: spd ? spd.mean : null,
        indicatedHp: ihpByRun.get(r.id) ?? null,
        load: null,
        alarms: (alarmsByRun.get(r.id) ?? []).map((a) => ({
          id: a.id,
          kind: a.kind,
          priority: a.priority,
          raisedAt: a.raisedAt,
          message: a.message,
          value: a.value,
        })),
        drift: null,
        driftNote: null,
      });
    }

    // One load measure for the whole history: indicated power when every run has it, else mean speed.
    const withRise = rows.filter((x) => x.riseAtPeakF !== null);
    const measure: LoadMeasure = withRise.length > 0 && withRise.every((x) => x.indicatedHp !== null) ? 'indicated_hp' : 'speed_rpm';
    const note =
      measure === 'indicated_hp'
        ? 'Load is the mean indicated power of the run\u2019s card sets.'
        : 'Load is the run\u2019s mean speed: indicated power is not known for every run (card sets missing), so speed stands in for load.';
    for (const x of rows) x.load = measure === 'indicated_hp' ? x.indicatedHp : x.meanSpeedRpm;

    const judged = rows.filter((x) => x.riseAtPeakF !== null && x.load !== null);
    const options = { confidence: DRIFT_SETTINGS.confidence, marginF: DRIFT_SETTINGS.marginF, minLoadSpread: MIN_LOAD_SPREAD[measure] };
    const verdicts = driftHistory(
      judged.map((x) => ({ id: x.runId, load: x.load!, temperatureRiseF: x.riseAtPeakF! })),
      options,
    );
    const rowOf = new Map(rows.map((x) => [x.runId, x]));
    for (const v of verdicts) {
      const row = rowOf.get(v.id)!;
      if (!v.check || !v.band) {
        row.driftNote =
          v.historyRuns === 0
            ? 'First run of this bearing: nothing earlier to compare with.'
            : `Too few runs to judge: ${v.historyRuns} earlier run${v.historyRuns > 1 ? 's' : ''}, ` +
              `at least ${MIN_RUNS_TO_JUDGE} are needed.`;
        continue;
      }
      const at = bandAt(v.band, row.load!);
      row.drift = {
        flagged: v.check.drift,
        limitF: v.check.limitF,
        expectedRiseF: v.check.expectedRiseF,
        excessF: v.check.excessF,
        extrapolated: v.check.extrapolated,
        historyRuns: v.historyRuns,
        bandKind: v.band.kind,
        confidence: v.band.confidence,
        degreesOfFreedom: v.band.degreesOfFreedom,
        tQuantile: v.band.tQuantile,
        halfWidthF: at.halfWidthF,
      };
    }
    for (const x of rows) {
      if (x.drift || x.driftNote) continue;
      x.driftNote =
        x.riseAtPeakF === null
          ? 'No ambient temperature was read in this run, so its rise is not known.'
          : 'No load figure (speed) for this run.';
    }
    const usual = judged.filter((x) => !x.drift?.flagged).map((x) => ({ load: x.load!, temperatureRiseF: x.riseAtPeakF! }));
    const band =
      usual.length >= MIN_RUNS_TO_JUDGE
        ? bandDto(
            fitBand(usual, options),
            judged.map((x) => x.load!),
          )
        : null;
    return { rows, measure, note, band };
  }

  async history(bearingId: string): Promise<BearingHistory> {
    const { engine, bearing } = await this.facts.bearing(bearingId);
    const ctx = await this.engineContext(engine.id);
    const points = ctx.points;
    const { stats, alarms } = await this.figures(ctx, [bearing.id]);
    const { rows, measure, note, band } = this.runRows(ctx, bearing.id, stats, alarms);
    const inspections = await this.inspections.ofBearing(bearing.id, bearing.label);
    const workRecords = await this.work.ofBearing(bearing.id, bearing.label);
    const f1 = (v: number | null) => (v === null ? '\u2014' : v.toFixed(0));
    const timeline: TimelineEntry[] = [
      ...rows.map((r) => ({
        at: r.startedAt!,
        type: 'run' as const,
        id: r.runId,
        title: r.title,
        detail:
          `Peak ${f1(r.peakTemperature)} ${r.unit === 'degC' ? '\u00b0C' : '\u00b0F'}, rise ${f1(r.riseAtPeakF)} \u00b0F` +
          `${r.alarms.length ? `, ${r.alarms.length} alarm${r.alarms.length > 1 ? 's' : ''}` : ''}` +
          `${r.drift?.flagged ? ' \u2014 drift' : ''}`,
        attention: !!r.drift?.flagged,
      })),
      ...inspections.map((i) => ({
        at: i.inspectedAt,
        type: 'inspection' as const,
        id: i.id,
        title: i.title,
        detail: i.measurementCount ? `${i.outOfToleranceCount} of ${i.measurementCount} measurements out of tolerance` : 'No measurements',
        attention: i.outOfToleranceCount > 0,
      })),
      ...workRecords.map((w) => ({
        at: w.startedAt,
        type: 'work' as const,
        id: w.id,
        title: w.title,
        detail: w.status === 'closed' ? `Closed ${w.closedAt!.slice(0, 10)}` : 'Open',
        attention: w.status === 'open',
      })),
    ].sort((a, b) => a.at.localeCompare(b.at));
    return {
      bearing: {
        id: bearing.id,
        label: bearing.label,
        kind: bearing.kind,
        engineId: engine.id,
        engineName: engine.name,
        journalDiameterIn: bearing.journalDiameterIn,
        journalLengthIn: bearing.journalLengthIn,
        radialClearanceIn: bearing.radialClearanceIn ?? null,
        loadSharePercent: bearing.loadSharePercent,
        points: points
          .filter((p) => p.kind === 'bearing_temperature' && p.bearingId === bearing.id)
          .map((p) => ({ id: p.id, code: p.code, unit: p.unit })),
      },
      loadMeasure: measure,
      loadMeasureNote: note,
      ruleText: historyRuleText(measure),
      settings: {
        confidence: DRIFT_SETTINGS.confidence,
        marginF: DRIFT_SETTINGS.marginF,
        minLoadSpread: MIN_LOAD_SPREAD[measure],
        minRunsToJudge: MIN_RUNS_TO_JUDGE,
      },
      runs: rows,
      band,
      inspections,
      workRecords,
      timeline,
    };
  }

  /**
   * Every bearing of every engine with a short account of its runs. The engines are read side by side; the
   * list needs no alarms (only the drift verdicts), so none are read, and of the engines only their bearings.
   */
  async list(): Promise<BearingListItem[]> {
    const names = await this.facts.engineNames();
    // Only the bearings' names are needed of each engine: one read for all engines, not each engine's whole detail.
    const bearingsOf = this.facts.activeBearings([...names.keys()]);
    const perEngine = await Promise.all(
      [...names].map(async ([engineId, engineName]): Promise<BearingListItem[]> => {
        const [all, ctx] = await Promise.all([bearingsOf, this.engineContext(engineId)]);
        const bearings = all.get(engineId) ?? [];
        const bearingIds = bearings.map((b) => b.id);
        const [{ stats }, inspected] = await Promise.all([
          this.figures(ctx, bearingIds, false),
          this.inspections.lastInspectedAt(bearingIds),
        ]);
        return bearings.map((b) => {
          const { rows } = this.runRows(ctx, b.id, stats, []);
          const last = rows[rows.length - 1];
          return {
            id: b.id,
            engineId,
            engineName,
            label: b.label,
            kind: b.kind,
            pointCodes: ctx.points.filter((p) => p.kind === 'bearing_temperature' && p.bearingId === b.id).map((p) => p.code),
            runCount: rows.length,
            lastRunAt: last?.startedAt ?? null,
            latestRunDrift: !!last?.drift?.flagged,
            driftRuns: rows.filter((r) => r.drift?.flagged).length,
            lastInspectionAt: inspected.get(b.id) ?? null,
          };
        });
      }),
    );
    return perEngine.flat();
  }
}
