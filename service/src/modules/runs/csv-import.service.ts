import { createHash } from 'node:crypto';
import type { Readable } from 'node:stream';
import { BadRequestException, Injectable } from '@nestjs/common';
import Papa from 'papaparse';
import type { IngestResult, RejectedRow } from '@crankjournal/shared-types';
import { AppConfig } from '../../config/app-config.service.js';
import { IngestService } from './ingest.service.js';
import { CsvLineLimiter } from './csv-lines.js';
import { RunsService } from './runs.service.js';
import type { Run } from './run.entity.js';

const CHUNK_ROWS = 5000;
const COLUMNS: Record<string, string> = {
  takenAt: 'taken_at',
  pointCode: 'point',
  pointId: 'point',
  value: 'value',
  unit: 'unit',
  clientId: 'client_id',
};

/** A stable id for a CSV row without one: the same point at the same moment in the same run is the same reading. */
export function csvRowClientId(runId: string, point: string, takenAt: string): string {
  const h = createHash('sha1')
    .update(`${runId}|${point.trim().toLowerCase()}|${new Date(takenAt).toISOString()}`)
    .digest('hex');
  const variant = ((parseInt(h[16], 16) & 0x3) | 0x8).toString(16);
  return `${h.slice(0, 8)}-${h.slice(8, 12)}-5${h.slice(13, 16)}-${variant}${h.slice(17, 20)}-${h.slice(20, 32)}`;
}

/**
 * Imports a logger's CSV file (columns taken_at, point, value[, unit][, client_id]) while it streams in:
 * parsed by papaparse, checked and stored in chunks, never held whole. Good rows are kept; each bad
 * row is reported with its line, column and reason.
 */
@Injectable()
export class CsvImportService {
  constructor(
    private readonly ingest: IngestService,
    private readonly runs: RunsService,
    private readonly config: AppConfig,
  ) {}

  async import(run: Run, body: Readable, userId: string): Promise<IngestResult> {
    this.runs.assertTakingReadings(run);
    const total: IngestResult = { stored: 0, duplicates: 0, rejected: [], rejectedCount: 0, alarmsRaised: 0 };
    const parser = Papa.parse(Papa.NODE_STREAM_INPUT, {
      header: true,
      skipEmptyLines: 'greedy',
      transformHeader: (h: string) => h.trim().toLowerCase(),
    }) as unknown as NodeJS.ReadWriteStream;
    // Bytes are counted and lines bounded before the parser sees them (see CsvLineLimiter).
    const limiter = new CsvLineLimiter(this.config.get('CSV_IMPORT_MAX_BYTES'), this.config.get('CSV_IMPORT_MAX_LINE_BYTES'));
    limiter.on('refused', (e: Error) => {
      body.unpipe(limiter);
      limiter.unpipe(parser);
      body.resume(); // the rest of the upload is read and dropped, so the answer reaches the client
      (parser as unknown as { destroy(e: Error): void }).destroy(e);
    });
    body.pipe(limiter).pipe(parser);
    let headerChecked = false;
    let line = 1;
    let chunk: { row: Record<string, unknown>; line: number }[] = [];
    const store = async (rows: typeof chunk) => {
      if (!rows.length) return;
      const lines = rows.map((c) => c.line);
      const r = await this.ingest.ingest(
        { run, source: 'import', enteredBy: userId, columnOf: (f) => COLUMNS[f] ?? f, lineOf: (i) => lines[i] },
        rows.map((c) => c.row),
      );
      total.stored += r.stored;
      total.duplicates += r.duplicates;
      total.alarmsRaised += r.alarmsRaised;
      total.rejectedCount += r.rejectedCount;
      for (const x of r.rejected) if (total.rejected.length < 1000) total.rejected.push(x);
    };
    // One chunk is stored while the next one is parsed (the database and the parser work side by side);
    // chunks are still stored one after another, in file order, and at most two are held at a time.
    // Typed by assertion: `flush` assigns it from a closure, which narrowing after `= null` would not see.
    let storing = null as Promise<void> | null;
    const flush = async () => {
      const rows = chunk;
      chunk = [];
      if (storing) await storing;
      storing = store(rows);
      storing.catch(() => undefined); // awaited at the next flush or at the end
    };
    const rejectLine = (row: RejectedRow) => {
      total.rejectedCount++;
      if (total.rejected.length < 1000) total.rejected.push(row);
    };
    const rows = async function* () {
      try {
        yield* parser as unknown as AsyncIterable<Record<string, string>>;
      } catch (e) {
        throw limiter.refusal ?? e;
      }
      if (limiter.refusal) throw limiter.refusal;
    };
    for await (const raw of rows()) {
      line++;
      if (!headerChecked) {
        const cols = Object.keys(raw);
        const missing = ['taken_at', 'point', 'value'].filter((c) => !cols.includes(c));
        if (missing.length) {
          body.unpipe(limiter);
          body.resume();
          throw new BadRequestException(
            "The file's first line must name the columns taken_at, point, value (and optionally unit, client_id); " +
              `missing: ${missing.join(', ')}.`,
          );
        }
        headerChecked = true;
      }
      if ('__parsed_extra' in raw) {
        rejectLine({ line, reason: 'the line has more cells than the header (check quoting)' });
        continue;
      }
      const point = (raw.point ?? '').trim();
      const takenAt = (raw.taken_at ?? '').trim();
      const valueText = (raw.value ?? '').trim();
      if (!point) {
        rejectLine({ line, column: 'point', field: 'pointCode', reason: 'point is empty' });
        continue;
      }
      if (!takenAt || Number.isNaN(Date.parse(takenAt))) {
        rejectLine({ line, column: 'taken_at', field: 'takenAt', reason: 'taken_at must be a date-time like 2026-06-14T10:15:00Z' });
        continue;
      }
      if (!/^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/.test(valueText)) {
        rejectLine({ line, column: 'value', field: 'value', reason: `value "${valueText.slice(0, 40)}" is not a number` });
        continue;
      }
      const clientId = (raw.client_id ?? '').trim() || csvRowClientId(run.id, point, takenAt);
      const row: Record<string, unknown> = {
        clientId,
        pointCode: point,
        value: Number(valueText),
        takenAt: new Date(takenAt).toISOString(),
      };
      if ((raw.unit ?? '').trim()) row.unit = raw.unit.trim();
      chunk.push({ row, line });
      if (chunk.length >= CHUNK_ROWS) await flush();
    }
    if (!headerChecked)
      throw new BadRequestException('The file is empty: it needs a header line (taken_at, point, value) and at least one reading.');
    await flush();
    await storing;
    return total;
  }
}
