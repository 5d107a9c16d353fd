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

const CHUNK_ROWS = 2500;
const NUMBER = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;
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
  return csvRowClientIdAt(runId, point, new Date(takenAt).toISOString());
}

/** csvRowClientId of a time already in ISO form (the import has it at hand). */
function csvRowClientIdAt(runId: string, point: string, iso: string): string {
  const h = createHash('sha1').update(`${runId}|${point.trim().toLowerCase()}|${iso}`).digest('hex');
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
    // Bytes are counted and lines bounded before the parser sees them (see CsvLineLimiter).
    const limiter = new CsvLineLimiter(this.config.get('CSV_IMPORT_MAX_BYTES'), this.config.get('CSV_IMPORT_MAX_LINE_BYTES'));
    const ctx = { run, source: 'import' as const, enteredBy: userId, columnOf: (f: string) => COLUMNS[f] ?? f };
    let header: string[] | null = null;
    let col = { taken_at: -1, point: -1, value: -1, unit: -1, client_id: -1 };
    let sawRow = false;
    let line = 1;
    let chunk: { row: Record<string, unknown>; line: number }[] = [];
    const addUp = (r: Omit<IngestResult, 'rejected'> & { rejected?: RejectedRow[] }) => {
      total.stored += r.stored;
      total.duplicates += r.duplicates;
      total.alarmsRaised += r.alarmsRaised;
      total.rejectedCount += r.rejectedCount;
      for (const x of r.rejected ?? []) if (total.rejected.length < 1000) total.rejected.push(x);
    };
    // A chunk is checked as soon as it is complete, while the one before it is stored (the database, the checks and
    // the parser work side by side); chunks are still stored one after another, in file order, at most two waiting.
    // Typed by assertion: `flush` assigns it from a closure, which narrowing after `= null` would not see.
    let storing = null as Promise<void> | null;
    const flush = async () => {
      const rows = chunk;
      chunk = [];
      if (!rows.length) return;
      const before = storing;
      storing = (async () => {
        const lines = rows.map((c) => c.line);
        const checked = await this.ingest.check(
          { ...ctx, lineOf: (i) => lines[i] },
          rows.map((c) => c.row),
        );
        if (before) await before;
        const r = await this.ingest.store(ctx, checked.good);
        addUp({ ...r, rejected: checked.rejected, rejectedCount: checked.rejectedCount });
      })();
      storing.catch(() => undefined); // awaited at the next flush or at the end
      if (before) await before;
    };
    const rejectLine = (row: RejectedRow) => {
      total.rejectedCount++;
      if (total.rejected.length < 1000) total.rejected.push(row);
    };
    const cell = (cells: string[], i: number) => (i >= 0 && i < cells.length ? cells[i].trim() : '');
    /** One parsed piece of the file (rows as arrays of cells; the first row of the file is the header). */
    const take = async (data: string[][]) => {
      for (const cells of data) {
        if (!header) {
          header = cells.map((h) => h.trim().toLowerCase());
          const at = (c: string) => header!.indexOf(c);
          col = { taken_at: at('taken_at'), point: at('point'), value: at('value'), unit: at('unit'), client_id: at('client_id') };
          continue;
        }
        line++;
        if (!sawRow) {
          const missing = ['taken_at', 'point', 'value'].filter((c) => !header!.includes(c));
          if (missing.length)
            throw new BadRequestException(
              "The file's first line must name the columns taken_at, point, value (and optionally unit, client_id); " +
                `missing: ${missing.join(', ')}.`,
            );
          sawRow = true;
        }
        if (cells.length > header.length) {
          rejectLine({ line, reason: 'the line has more cells than the header (check quoting)' });
          continue;
        }
        const point = cell(cells, col.point);
        const takenAt = cell(cells, col.taken_at);
        const valueText = cell(cells, col.value);
        if (!point) {
          rejectLine({ line, column: 'point', field: 'pointCode', reason: 'point is empty' });
          continue;
        }
        const ms = takenAt ? Date.parse(takenAt) : NaN;
        if (Number.isNaN(ms)) {
          rejectLine({ line, column: 'taken_at', field: 'takenAt', reason: 'taken_at must be a date-time like 2026-06-14T10:15:00Z' });
          continue;
        }
        if (!NUMBER.test(valueText)) {
          rejectLine({ line, column: 'value', field: 'value', reason: `value "${valueText.slice(0, 40)}" is not a number` });
          continue;
        }
        const iso = new Date(ms).toISOString();
        const row: Record<string, unknown> = {
          clientId: cell(cells, col.client_id) || csvRowClientIdAt(run.id, point, iso),
          pointCode: point,
          value: Number(valueText),
          takenAt: iso,
        };
        const unit = cell(cells, col.unit);
        if (unit) row.unit = unit;
        chunk.push({ row, line });
        if (chunk.length >= CHUNK_ROWS) await flush();
      }
    };
    // papaparse reads the stream a piece at a time and hands over all rows of a piece at once (its row-by-row stream
    // mode pauses after every 16 rows and parses the rest of the piece again each time); it is paused while a piece
    // is taken (and a full chunk waits for the database), which pauses the upload too.
    await new Promise<void>((resolve, reject) => {
      let failed = false;
      const fail = (e: unknown) => {
        if (failed) return;
        failed = true;
        body.unpipe(limiter);
        body.resume(); // the rest of the upload is read and dropped, so the answer reaches the client
        reject(e);
      };
      limiter.on('refused', fail);
      Papa.parse<string[]>(limiter, {
        header: false,
        skipEmptyLines: 'greedy',
        chunk: (results, parser) => {
          if (failed) return parser.abort();
          // The parser's own pause stops only its parsing; pausing its input holds back the upload as well.
          parser.pause();
          limiter.pause();
          take(results.data).then(
            () => {
              if (failed) return parser.abort();
              limiter.resume();
              parser.resume();
            },
            (e: unknown) => {
              fail(e);
              parser.abort();
            },
          );
        },
        complete: () => (limiter.refusal ? fail(limiter.refusal) : resolve()),
        error: (e: Error) => fail(limiter.refusal ?? e),
      });
      body.pipe(limiter);
    });
    if (!sawRow)
      throw new BadRequestException('The file is empty: it needs a header line (taken_at, point, value) and at least one reading.');
    await flush();
    await storing;
    return total;
  }
}
