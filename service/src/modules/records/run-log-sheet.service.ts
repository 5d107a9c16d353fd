import { Injectable } from '@nestjs/common';
import { RUN_PURPOSE_LABELS, type ChecklistDetail } from '@crankjournal/shared-types';
import { renderRecord, recordFileName, type RenderedRecord } from '../../common/pdf/record-document.js';
import { zonedClock } from '../../common/pdf/zoned-time.js';
import { RunsService } from '../runs/runs.service.js';
import { ReadingsService } from '../runs/readings.service.js';
import { EnginesService } from '../engines/engines.service.js';
import { AlarmsService } from '../alarms/alarms.service.js';
import { ChecklistsService } from '../checklists/checklists.service.js';
import { CardSetsService } from '../indicator-cards/card-sets.service.js';
import { SiteService } from '../site/site.service.js';
import { LOG_SHEET_SECTIONS, type LogSheetContext } from './run-log-sheet.sections.js';

/** The run log sheet as a chief engineer would file it. */
@Injectable()
export class RunLogSheetService {
  constructor(
    private readonly runs: RunsService,
    private readonly readingsService: ReadingsService,
    private readonly engines: EnginesService,
    private readonly alarmsService: AlarmsService,
    private readonly checklistsService: ChecklistsService,
    private readonly cardSetsService: CardSetsService,
    private readonly site: SiteService,
  ) {}

  async context(runId: string): Promise<LogSheetContext> {
    const run = await this.runs.detail(runId);
    const [engine, readingList, alarmList, overview, sets, site] = await Promise.all([
      this.engines.detail(run.engineId),
      this.readingsService.list(runId, { limit: 200_000 }),
      this.alarmsService.list({ runId }),
      this.checklistsService.overview(runId),
      this.cardSetsService.list(runId),
      this.site.settings(),
    ]);
    const details: ChecklistDetail[] = [];
    for (const c of overview.checklists) details.push(await this.checklistsService.detail(c.id));
    details.sort((a, b) => a.startedAt.localeCompare(b.startedAt));
    const until = run.closedAt ?? run.stoppedAt;
    const figures = await this.alarmsService.figures(
      [
        {
          id: run.id,
          from: new Date(run.createdAt),
          to: until ? new Date(until) : new Date(),
          startedAt: run.startedAt ? new Date(run.startedAt) : null,
        },
      ],
      (pointId, at) => this.readingsService.valuesAt(pointId, at),
    );
    return {
      alarmFigures: this.alarmsService.logSheetAlarmRows(figures),
      run,
      engine,
      readings: readingList,
      alarms: alarmList,
      checklists: details,
      cardSets: [...sets].sort((a, b) => a.takenAt.localeCompare(b.takenAt)),
      site,
      clock: zonedClock(site.timeZone),
    };
  }

  async render(runId: string, printedBy: string, printedAt = new Date()): Promise<RenderedRecord & { filename: string }> {
    const c = await this.context(runId);
    const when = c.run.startedAt ?? c.run.plannedFor ?? c.run.createdAt;
    const rendered = await renderRecord({
      title: `Run log sheet: ${c.run.title}`,
      subtitle: `${c.engine.name} \u00b7 ${RUN_PURPOSE_LABELS[c.run.purpose]} \u00b7 ${c.clock.date(when)}`,
      works: c.site.worksName,
      engine: c.engine.name,
      timeZone: c.site.timeZone,
      printedAt,
      printedBy,
      landscape: true,
      subject: 'Run log sheet',
      blocks: LOG_SHEET_SECTIONS.flatMap((s) => s(c)),
    });
    return { ...rendered, filename: recordFileName('run-log', c.clock.isoDate(when), c.run.title) };
  }
}
