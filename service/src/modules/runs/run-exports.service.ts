import { type Readable, PassThrough } from 'node:stream';
import { Injectable } from '@nestjs/common';
import { EnginesService } from '../engines/engines.service.js';
import { csvLine } from '../../common/util/csv.util.js';
import { RunsService } from './runs.service.js';
import { ReadingsService } from './readings.service.js';

/** Records out: the run's readings as CSV (the log sheet is printed by the records module). */
@Injectable()
export class RunExportsService {
  constructor(
    private readonly readings: ReadingsService,
    private readonly runs: RunsService,
    private readonly engines: EnginesService,
  ) {}

  /** CSV streamed page by page; text cells that a spreadsheet would run are neutralised. */
  async readingsCsv(runId: string): Promise<{ filename: string; stream: Readable }> {
    const run = await this.runs.get(runId);
    const { points } = await this.engines.withPoints(run.engineId);
    const byId = new Map(points.map((p) => [p.id, p]));
    const out = new PassThrough();
    void (async () => {
      try {
        out.write(
          csvLine(['taken_at', 'point', 'point_label', 'value', 'unit', 'original_value', 'amendment_reason', 'source', 'reading_id']),
        );
        for await (const page of this.readings.iterate(runId)) {
          const am = await this.readings.amendmentsOf(page.filter((r) => r.amendedValue !== null).map((r) => r.id));
          const reason = new Map<string, string>();
          for (const a of am) reason.set(a.readingId, a.reason);
          let chunk = '';
          for (const r of page) {
            const p = byId.get(r.pointId);
            chunk += csvLine([
              r.takenAt,
              p?.code ?? '',
              p?.label ?? '',
              r.amendedValue ?? r.value,
              r.unit,
              r.amendedValue !== null ? r.value : '',
              reason.get(String(r.id)) ?? '',
              r.source,
              String(r.id),
            ]);
          }
          if (!out.write(chunk)) await new Promise((res) => out.once('drain', res));
        }
        out.end();
      } catch (e) {
        out.destroy(e as Error);
      }
    })();
    return { filename: `run-${run.title.replace(/[^A-Za-z0-9]+/g, '-').slice(0, 40)}-readings.csv`, stream: out };
  }
}
