import { type Readable, PassThrough } from 'node:stream';
import PDFDocument from 'pdfkit';
import { Injectable } from '@nestjs/common';
import { RUN_PURPOSE_LABELS, RUN_STATE_LABELS, ALARM_KIND_WORDS, ALARM_STATE_WORDS } from '@crankjournal/shared-types';
import { unitLabel } from '../../calculations/units.js';
import { EnginesService } from '../engines/engines.service.js';
import { AlarmsService } from '../alarms/alarms.service.js';
import { csvLine } from '../../common/util/csv.util.js';
import { RunsService } from './runs.service.js';
import { ReadingsService } from './readings.service.js';

const fmtTime = (d: Date | string | null) => (d ? new Date(d).toISOString().replace('T', ' ').slice(0, 16) + ' UTC' : '—');

/** Records out: the run's readings as CSV and the run log sheet as PDF. */
@Injectable()
export class RunExportsService {
  constructor(
    private readonly readings: ReadingsService,
    private readonly runs: RunsService,
    private readonly engines: EnginesService,
    private readonly alarms: AlarmsService,
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

  /** The run log sheet: header, crew, state history, readings by round, alarms, amendments, signatures. */
  async logSheetPdf(runId: string): Promise<{ filename: string; stream: Readable }> {
    const d = await this.runs.detail(runId);
    const engine = await this.engines.detail(d.engineId);
    const alarms = await this.alarms.list({ runId });
    const readings = await this.readings.list(runId, {});
    const pointsBySeq = engine.measurementPoints;
    const doc = new PDFDocument({
      size: 'A4',
      layout: 'landscape',
      margin: 36,
      info: { Title: `Run log: ${d.title}`, Author: 'Crankjournal' },
    });
    const out = new PassThrough();
    doc.pipe(out);
    doc.font('Helvetica-Bold').fontSize(16).text(`Run log sheet — ${engine.name}`);
    doc.font('Helvetica').fontSize(10);
    doc.text(`${d.title} · ${RUN_PURPOSE_LABELS[d.purpose]} · state: ${RUN_STATE_LABELS[d.state]}`);
    doc.text(
      `Started ${fmtTime(d.startedAt)} · stopped ${fmtTime(d.stoppedAt)} · ` +
        `running ${(d.runningSeconds / 3600).toFixed(2)} h · ${Math.round(d.revolutions)} revolutions`,
    );
    doc.text(`Crew: ${d.crew.map((c) => c.displayName).join(', ') || '—'}`);
    if (d.notes) doc.text(`Notes: ${d.notes}`);
    doc.moveDown(0.5);
    doc.font('Helvetica-Bold').text('State history');
    doc.font('Helvetica');
    for (const h of d.history)
      doc.text(
        `${fmtTime(h.at)}  ${h.from ? RUN_STATE_LABELS[h.from] + ' → ' : ''}${RUN_STATE_LABELS[h.to]}  ` +
          `by ${h.byName}${h.note ? ` — ${h.note}` : ''}`,
      );
    // Readings grouped into rounds by minute, one column per point (as many as fit on the sheet).
    doc.moveDown(0.5).font('Helvetica-Bold').text('Readings');
    const cols = pointsBySeq.slice(0, 11);
    const rounds = new Map<string, Map<string, { v: number; amended: boolean }>>();
    for (const r of readings) {
      const key = r.takenAt.slice(0, 16);
      const m = rounds.get(key) ?? new Map();
      m.set(r.pointId, { v: r.value, amended: r.originalValue !== null });
      rounds.set(key, m);
    }
    const x0 = doc.page.margins.left;
    const colW = (doc.page.width - doc.page.margins.left - doc.page.margins.right - 90) / Math.max(cols.length, 1);
    const header = () => {
      const y = doc.y;
      doc.font('Helvetica-Bold').fontSize(7);
      doc.text('Time (UTC)', x0, y, { width: 90 });
      cols.forEach((p, i) => doc.text(`${p.code} ${unitLabel(p.unit)}`, x0 + 90 + i * colW, y, { width: colW }));
      doc.moveDown(0.3);
    };
    header();
    doc.font('Helvetica').fontSize(8);
    let shown = 0;
    for (const [t, m] of [...rounds.entries()].sort()) {
      if (shown++ > 400) break;
      if (doc.y > doc.page.height - 60) {
        doc.addPage();
        header();
        doc.font('Helvetica').fontSize(8);
      }
      const y = doc.y;
      doc.text(t.replace('T', ' '), x0, y, { width: 90 });
      cols.forEach((p, i) => {
        const c = m.get(p.id);
        doc.text(c ? `${+c.v.toFixed(2)}${c.amended ? '*' : ''}` : '', x0 + 90 + i * colW, y, { width: colW });
      });
      doc.moveDown(0.1);
    }
    doc.fontSize(8).text('* amended: see the amendments below; the original value stays in the record.', x0);
    doc.addPage();
    doc.font('Helvetica-Bold').fontSize(11).text('Alarms');
    doc.font('Helvetica').fontSize(9);
    if (!alarms.length) doc.text('None.');
    for (const a of alarms)
      doc.text(
        `${fmtTime(a.raisedAt)}  ${ALARM_KIND_WORDS[a.kind]} — ${a.message}  [${ALARM_STATE_WORDS[a.state]}` +
          `${a.suppression ? `, suppressed by ${a.suppressedByLabel ?? a.suppression}` : ''}` +
          `${a.acknowledgedByName ? `, acknowledged by ${a.acknowledgedByName} ${fmtTime(a.acknowledgedAt)}` : ''}]`,
      );
    // The alarm system's own figures (rows from AlarmsService, so any layout can place them).
    const run = await this.runs.get(runId);
    const figures = await this.alarms.figures(
      [{ id: run.id, from: run.createdAt, to: run.closedAt ?? run.stoppedAt ?? new Date(), startedAt: run.startedAt }],
      (pointId, at) => this.readings.valuesAt(pointId, at),
    );
    doc.moveDown(0.5).font('Helvetica-Bold').fontSize(11).text('Alarm system figures');
    doc.font('Helvetica').fontSize(9);
    for (const r of this.alarms.logSheetAlarmRows(figures)) doc.text(`${r.label}: ${r.value}   target ${r.target}`);
    doc.fontSize(8).text(figures.basis);
    doc.moveDown(0.5).font('Helvetica-Bold').fontSize(11).text('Amendments');
    doc.font('Helvetica').fontSize(9);
    const amended = readings.filter((r) => r.amendments.length);
    if (!amended.length) doc.text('None.');
    for (const r of amended)
      for (const a of r.amendments)
        doc.text(
          `${fmtTime(r.takenAt)} ${pointsBySeq.find((p) => p.id === r.pointId)?.code ?? ''}: ` +
            `${a.oldValue} → ${a.newValue} by ${a.byName} at ${fmtTime(a.at)} — ${a.reason}`,
        );
    doc.moveDown(1).font('Helvetica-Bold').fontSize(11).text('Countersignature');
    doc
      .font('Helvetica')
      .fontSize(10)
      .text(
        d.countersignedByName
          ? `Countersigned by ${d.countersignedByName} (chief engineer) at ${fmtTime(d.countersignedAt)}.`
          : 'Not yet countersigned.',
      );
    doc
      .moveDown(1)
      .fontSize(8)
      .fillColor('#555')
      .text(
        'Crankjournal aids a qualified crew. It never replaces local boiler and pressure-vessel law, ' +
          'the insurer’s inspections or licensed practice.',
      );
    doc.end();
    return { filename: `run-${d.title.replace(/[^A-Za-z0-9]+/g, '-').slice(0, 40)}-log-sheet.pdf`, stream: out };
  }
}
