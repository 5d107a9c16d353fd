import { PassThrough, Readable } from 'node:stream';
import { Injectable } from '@nestjs/common';
import PDFDocument from 'pdfkit';
import { ALARM_KIND_WORDS, INSPECTION_KIND_LABELS, type BearingHistory } from '@crankjournal/shared-types';
import { csvLine } from '../../common/util/csv.util.js';
import { BearingHistoryService } from './bearing-history.service.js';

const day = (iso: string | null) => (iso ? iso.slice(0, 10) : '');
const fmt = (v: number | null | undefined, d = 1) => (v === null || v === undefined || !Number.isFinite(v) ? '' : v.toFixed(d));
const unitWord = (u: string) => (u === 'degC' ? '°C' : '°F');
const fileStem = (h: BearingHistory) =>
  `bearing-${h.bearing.label
    .replace(/[^A-Za-z0-9]+/g, '-')
    .replace(/^-|-$/g, '')
    .slice(0, 40)}-history`;

/** Records out: a bearing's history as CSV (one row per run, then inspections and work) and as a PDF report. */
@Injectable()
export class BearingHistoryExportsService {
  constructor(private readonly history: BearingHistoryService) {}

  async csv(bearingId: string): Promise<{ filename: string; stream: Readable }> {
    const h = await this.history.history(bearingId);
    const lines: string[] = [];
    lines.push(
      csvLine([
        'record',
        'date',
        'title',
        'point',
        'unit',
        'peak_temperature',
        'mean_temperature',
        'ambient_mean',
        'rise_at_peak_F',
        'mean_speed_rpm',
        'indicated_hp',
        'load',
        'alarms',
        'drift_flag',
        'drift_limit_F',
        'expected_rise_F',
        'detail',
        'id',
      ]),
    );
    for (const r of h.runs) {
      lines.push(
        csvLine([
          'run',
          day(r.startedAt),
          r.title,
          r.pointCode,
          r.unit,
          +r.peakTemperature.toFixed(2),
          +r.meanTemperature.toFixed(2),
          r.ambientMean === null ? '' : +r.ambientMean.toFixed(2),
          r.riseAtPeakF === null ? '' : +r.riseAtPeakF.toFixed(2),
          r.meanSpeedRpm === null ? '' : +r.meanSpeedRpm.toFixed(2),
          r.indicatedHp === null ? '' : +r.indicatedHp.toFixed(1),
          r.load === null ? '' : +r.load.toFixed(2),
          r.alarms.map((a) => `${ALARM_KIND_WORDS[a.kind]} ${a.raisedAt.slice(11, 16)}`).join('; '),
          r.drift ? (r.drift.flagged ? 'DRIFT' : 'ok') : '',
          r.drift ? +r.drift.limitF.toFixed(2) : '',
          r.drift ? +r.drift.expectedRiseF.toFixed(2) : '',
          r.driftNote ?? '',
          r.runId,
        ]),
      );
    }
    for (const i of h.inspections)
      lines.push(
        csvLine([
          'inspection',
          day(i.inspectedAt),
          i.title,
          '',
          '',
          '',
          '',
          '',
          '',
          '',
          '',
          '',
          '',
          '',
          '',
          '',
          `${INSPECTION_KIND_LABELS[i.kind]}: ${i.outOfToleranceCount} of ${i.measurementCount} out of tolerance. ${i.findings}`,
          i.id,
        ]),
      );
    for (const w of h.workRecords)
      lines.push(
        csvLine([
          'work',
          day(w.startedAt),
          w.title,
          '',
          '',
          '',
          '',
          '',
          '',
          '',
          '',
          '',
          '',
          '',
          '',
          '',
          w.status === 'closed' ? `closed ${day(w.closedAt)}` : 'open',
          w.id,
        ]),
      );
    lines.push(csvLine([]));
    lines.push(csvLine(['rule', '', h.ruleText]));
    lines.push(csvLine(['load', '', h.loadMeasureNote]));
    return { filename: `${fileStem(h)}.csv`, stream: Readable.from([lines.join('')]) };
  }

  /** Rise above ambient run by run, each run's drift limit dashed, flagged runs in red (drawn with the PDF's own lines). */
  private riseChart(doc: PDFKit.PDFDocument, h: BearingHistory, x0: number, width: number) {
    const runs = h.runs.filter((r) => r.riseAtPeakF !== null);
    if (runs.length < 2) return;
    const height = 130;
    if (doc.y + height + 40 > doc.page.height - doc.page.margins.bottom) doc.addPage();
    doc
      .moveDown(0.6)
      .font('Helvetica-Bold')
      .fontSize(10)
      .text('Rise above ambient at peak, \u00b0F, run by run (dashed: the drift limit each run was judged against)', x0);
    const top = doc.y + 6;
    const left = x0 + 36;
    const w = Math.min(width - 40, 560);
    const values = runs.flatMap((r) => [r.riseAtPeakF!, ...(r.drift ? [r.drift.limitF] : [])]);
    const lo = Math.floor(Math.min(0, ...values) / 10) * 10;
    const hi = Math.ceil((Math.max(...values) * 1.1) / 10) * 10;
    const y = (v: number) => top + height - ((v - lo) / (hi - lo || 1)) * height;
    const x = (i: number) => left + (runs.length === 1 ? w / 2 : (i * w) / (runs.length - 1));
    doc.lineWidth(0.5).strokeColor('#999');
    doc.rect(left, top, w, height).stroke();
    doc.font('Helvetica').fontSize(7).fillColor('#555');
    for (let v = lo; v <= hi; v += Math.max(10, Math.round((hi - lo) / 50) * 10)) {
      doc.text(String(v), x0, y(v) - 3, { width: 30, align: 'right' });
      doc
        .moveTo(left, y(v))
        .lineTo(left + w, y(v))
        .strokeColor('#ddd')
        .stroke();
    }
    runs.forEach((r, i) => (i === 0 ? doc.moveTo(x(i), y(r.riseAtPeakF!)) : doc.lineTo(x(i), y(r.riseAtPeakF!))));
    doc.strokeColor('#2f6b5e').lineWidth(1).stroke();
    runs.forEach((r, i) => {
      if (r.drift) {
        doc
          .moveTo(x(i) - 8, y(r.drift.limitF))
          .lineTo(x(i) + 8, y(r.drift.limitF))
          .dash(2, { space: 2 })
          .strokeColor('#b37100')
          .stroke()
          .undash();
      }
      doc
        .circle(x(i), y(r.riseAtPeakF!), 3)
        .fillColor(r.drift?.flagged ? '#b01e1e' : '#2f6b5e')
        .fill();
      doc
        .fillColor('#555')
        .fontSize(6.5)
        .text(day(r.startedAt), x(i) - 25, top + height + 3, { width: 50, align: 'center' });
    });
    doc.fillColor('black').strokeColor('black').lineWidth(1);
    doc.x = x0;
    doc.y = top + height + 16;
  }

  async pdf(bearingId: string): Promise<{ filename: string; stream: Readable }> {
    const h = await this.history.history(bearingId);
    const doc = new PDFDocument({
      size: 'A4',
      layout: 'landscape',
      margin: 36,
      info: { Title: `Bearing history: ${h.bearing.label}`, Author: 'Crankjournal' },
    });
    const out = new PassThrough();
    doc.pipe(out);
    const x0 = doc.page.margins.left;
    const width = doc.page.width - doc.page.margins.left - doc.page.margins.right;
    doc.font('Helvetica-Bold').fontSize(16).text(`Bearing history \u2014 ${h.bearing.label}`);
    doc.font('Helvetica').fontSize(10);
    doc.text(
      `${h.bearing.engineName} \u00b7 journal ${h.bearing.journalDiameterIn} in \u00d7 ${h.bearing.journalLengthIn} in` +
        `${h.bearing.radialClearanceIn ? ` \u00b7 radial clearance ${h.bearing.radialClearanceIn} in` : ''}` +
        ` \u00b7 ${h.bearing.loadSharePercent} % of the rotating load` +
        ` \u00b7 points ${h.bearing.points.map((p) => p.code).join(', ') || '\u2014'}` +
        ` \u00b7 printed ${new Date().toISOString().slice(0, 10)}`,
    );
    doc.moveDown(0.5);

    // Runs table
    doc.font('Helvetica-Bold').fontSize(11).text('Runs');
    const cols: { head: string; w: number; cell: (r: BearingHistory['runs'][number]) => string }[] = [
      { head: 'Date', w: 62, cell: (r) => day(r.startedAt) },
      { head: 'Run', w: 150, cell: (r) => r.title },
      { head: 'Hours', w: 40, cell: (r) => fmt(r.runningHours, 2) },
      { head: 'Peak', w: 48, cell: (r) => `${fmt(r.peakTemperature)} ${unitWord(r.unit)}` },
      { head: 'Mean', w: 48, cell: (r) => `${fmt(r.meanTemperature)} ${unitWord(r.unit)}` },
      { head: 'Ambient', w: 50, cell: (r) => (r.ambientMean === null ? '\u2014' : `${fmt(r.ambientMean)} ${unitWord(r.unit)}`) },
      { head: 'Rise \u00b0F', w: 44, cell: (r) => fmt(r.riseAtPeakF) },
      { head: 'Speed rpm', w: 50, cell: (r) => fmt(r.meanSpeedRpm) },
      { head: 'IHP', w: 40, cell: (r) => fmt(r.indicatedHp, 0) },
      { head: 'Alarms', w: 120, cell: (r) => r.alarms.map((a) => ALARM_KIND_WORDS[a.kind]).join(', ') || '\u2014' },
      {
        head: 'Drift',
        w: 0,
        cell: (r) =>
          r.drift
            ? r.drift.flagged
              ? `DRIFT: ${fmt(r.riseAtPeakF)} > ${fmt(r.drift.limitF)} \u00b0F`
              : `ok (limit ${fmt(r.drift.limitF)})`
            : '\u2014',
      },
    ];
    const fixed = cols.reduce((s, c) => s + c.w, 0);
    cols[cols.length - 1].w = Math.max(80, width - fixed);
    const row = (cells: string[], bold = false) => {
      if (doc.y > doc.page.height - 60) doc.addPage();
      const y = doc.y;
      let x = x0;
      doc.font(bold ? 'Helvetica-Bold' : 'Helvetica').fontSize(8);
      let bottom = y;
      cells.forEach((c, i) => {
        doc.text(c, x, y, { width: cols[i].w - 4 });
        bottom = Math.max(bottom, doc.y);
        x += cols[i].w;
      });
      doc.x = x0;
      doc.y = bottom + 2;
    };
    row(
      cols.map((c) => c.head),
      true,
    );
    for (const r of h.runs) {
      if (r.drift?.flagged) doc.fillColor('#b01e1e');
      row(cols.map((c) => c.cell(r)));
      doc.fillColor('black');
    }
    doc.moveDown(0.5).font('Helvetica').fontSize(8).text(`Drift rule: ${h.ruleText}`, x0, doc.y, { width });
    doc.text(h.loadMeasureNote, x0, doc.y, { width });
    if (h.band)
      doc.text(
        `Usual band now (${h.band.pointCount} runs, ${h.band.kind === 'mean' ? 'mean rise' : 'straight line'}): ` +
          `expected rise ${fmt(h.band.interceptF)} \u00b0F` +
          `${h.band.kind === 'regression' ? ` + ${h.band.slopeFPerLoad.toFixed(4)} \u00b0F per unit of load` : ''}` +
          `, s = ${fmt(h.band.residualSdF, 2)} \u00b0F.`,
        x0,
        doc.y,
        { width },
      );

    this.riseChart(doc, h, x0, width);

    doc.moveDown(0.8).font('Helvetica-Bold').fontSize(11).text('Inspections and work on the same timeline', x0);
    doc.font('Helvetica').fontSize(9);
    if (!h.timeline.length) doc.text('None.');
    for (const t of h.timeline) {
      if (doc.y > doc.page.height - 50) doc.addPage();
      const kind = t.type === 'run' ? 'Run' : t.type === 'inspection' ? 'Inspection' : 'Work';
      doc.fillColor(t.attention ? '#b01e1e' : 'black').text(`${day(t.at)}  ${kind}: ${t.title} \u2014 ${t.detail}`, x0, doc.y, { width });
    }
    doc.fillColor('black');
    for (const i of h.inspections.filter((x) => x.findings)) {
      if (doc.y > doc.page.height - 60) doc.addPage();
      doc
        .moveDown(0.4)
        .font('Helvetica-Bold')
        .fontSize(9)
        .text(`Findings, ${day(i.inspectedAt)} \u2014 ${i.title}`, x0, doc.y, { width });
      doc.font('Helvetica').text(i.findings, x0, doc.y, { width });
    }
    doc
      .moveDown(1)
      .fontSize(8)
      .fillColor('#555')
      .text(
        'Crankjournal aids a qualified crew. It never replaces local boiler and pressure-vessel law, ' +
          'the insurer\u2019s inspections or licensed practice.',
        x0,
        doc.y,
        { width },
      );
    doc.end();
    return { filename: `${fileStem(h)}.pdf`, stream: out };
  }
}
