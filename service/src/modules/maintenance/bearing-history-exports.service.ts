import { Readable } from 'node:stream';
import { Injectable } from '@nestjs/common';
import { ALARM_KIND_WORDS, INSPECTION_KIND_LABELS, type BearingHistory } from '@crankjournal/shared-types';
import { csvLine } from '../../common/util/csv.util.js';
import { PALETTE, RECORD_DISCLAIMER, renderRecord, type Block } from '../../common/pdf/record-document.js';
import { zonedClock, type ZonedClock } from '../../common/pdf/zoned-time.js';
import { SiteService } from '../site/site.service.js';
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
  constructor(
    private readonly history: BearingHistoryService,
    private readonly site: SiteService,
  ) {}

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
  private riseChart(h: BearingHistory, clock: ZonedClock): Block[] {
    const runs = h.runs.filter((r) => r.riseAtPeakF !== null);
    if (runs.length < 2) return [];
    const height = 130;
    return [
      { kind: 'subheading', text: 'Rise above ambient at peak, \u00b0F, run by run (dashed: the drift limit each run was judged against)' },
      {
        kind: 'drawing',
        height: height + 26,
        draw: (doc, box) => {
          const top = box.y + 4;
          const left = box.x + 36;
          const w = Math.min(box.w - 40, 560);
          const values = runs.flatMap((r) => [r.riseAtPeakF!, ...(r.drift ? [r.drift.limitF] : [])]);
          const lo = Math.floor(Math.min(0, ...values) / 10) * 10;
          const hi = Math.ceil((Math.max(...values) * 1.1) / 10) * 10;
          const y = (v: number) => top + height - ((v - lo) / (hi - lo || 1)) * height;
          const x = (i: number) => left + (i * w) / (runs.length - 1);
          doc.lineWidth(0.5).strokeColor(PALETTE.rule);
          doc.rect(left, top, w, height).stroke();
          doc.font('narrow').fontSize(7).fillColor(PALETTE.muted);
          for (let v = lo; v <= hi; v += Math.max(10, Math.round((hi - lo) / 50) * 10)) {
            doc.text(String(v), box.x, y(v) - 3, { width: 30, align: 'right', lineBreak: false });
            doc
              .moveTo(left, y(v))
              .lineTo(left + w, y(v))
              .strokeColor(PALETTE.surface)
              .stroke();
          }
          runs.forEach((r, i) => (i === 0 ? doc.moveTo(x(i), y(r.riseAtPeakF!)) : doc.lineTo(x(i), y(r.riseAtPeakF!))));
          doc.strokeColor(PALETTE.copper).lineWidth(1).stroke();
          // Date labels only where they have room (about 50 pt each).
          const every = Math.max(1, Math.ceil((runs.length * 50) / w));
          runs.forEach((r, i) => {
            if (r.drift) {
              doc
                .moveTo(x(i) - 8, y(r.drift.limitF))
                .lineTo(x(i) + 8, y(r.drift.limitF))
                .dash(2, { space: 2 })
                .strokeColor(PALETTE.amber)
                .stroke()
                .undash();
            }
            doc
              .circle(x(i), y(r.riseAtPeakF!), 3)
              .fillColor(r.drift?.flagged ? PALETTE.red : PALETTE.copper)
              .fill();
            if (i % every === 0)
              doc
                .fillColor(PALETTE.muted)
                .fontSize(6.5)
                .text(clock.date(r.startedAt).slice(0, 6), x(i) - 25, top + height + 9, { width: 50, align: 'center', lineBreak: false });
          });
        },
      },
    ];
  }

  async pdf(bearingId: string, printedBy: string, printedAt = new Date()): Promise<{ filename: string; buffer: Buffer }> {
    const h = await this.history.history(bearingId);
    const site = await this.site.settings();
    const clock = zonedClock(site.timeZone);
    const date = (iso: string | null) => (iso ? clock.date(iso) : '\u2014');
    type RunRow = BearingHistory['runs'][number];
    const cols: { head: string; width?: number; align?: 'right'; cell: (r: RunRow) => string }[] = [
      { head: 'Date', width: 60, cell: (r) => date(r.startedAt) },
      { head: 'Run', cell: (r) => r.title },
      { head: 'Hours', width: 40, align: 'right', cell: (r) => fmt(r.runningHours, 2) },
      { head: 'Peak', width: 50, align: 'right', cell: (r) => `${fmt(r.peakTemperature)} ${unitWord(r.unit)}` },
      { head: 'Mean', width: 50, align: 'right', cell: (r) => `${fmt(r.meanTemperature)} ${unitWord(r.unit)}` },
      {
        head: 'Ambient',
        width: 50,
        align: 'right',
        cell: (r) => (r.ambientMean === null ? '\u2014' : `${fmt(r.ambientMean)} ${unitWord(r.unit)}`),
      },
      { head: 'Rise \u00b0F', width: 44, align: 'right', cell: (r) => fmt(r.riseAtPeakF) },
      { head: 'Speed rpm', width: 50, align: 'right', cell: (r) => fmt(r.meanSpeedRpm) },
      { head: 'IHP', width: 40, align: 'right', cell: (r) => fmt(r.indicatedHp, 0) },
      { head: 'Alarms', width: 110, cell: (r) => r.alarms.map((a) => ALARM_KIND_WORDS[a.kind]).join(', ') || '\u2014' },
      {
        head: 'Drift',
        width: 120,
        cell: (r) =>
          r.drift
            ? r.drift.flagged
              ? `DRIFT: ${fmt(r.riseAtPeakF)} > ${fmt(r.drift.limitF)} \u00b0F`
              : `ok (limit ${fmt(r.drift.limitF)})`
            : '\u2014',
      },
    ];
    const blocks: Block[] = [
      {
        kind: 'facts',
        columns: 3,
        items: [
          { label: 'Engine', value: h.bearing.engineName },
          { label: 'Journal', value: `${h.bearing.journalDiameterIn} in \u00d7 ${h.bearing.journalLengthIn} in` },
          { label: 'Radial clearance', value: h.bearing.radialClearanceIn ? `${h.bearing.radialClearanceIn} in` : '\u2014' },
          { label: 'Load share', value: `${h.bearing.loadSharePercent} % of the rotating load` },
          { label: 'Points', value: h.bearing.points.map((p) => p.code).join(', ') },
        ],
      },
      { kind: 'heading', text: 'Runs' },
      {
        kind: 'table',
        empty: 'No run has readings of this bearing.',
        columns: cols.map((c) => ({ head: c.head, width: c.width, align: c.align })),
        rows: h.runs.map((r) => cols.map((c) => ({ text: c.cell(r), tone: r.drift?.flagged ? ('danger' as const) : undefined }))),
      },
      { kind: 'text', size: 8, text: `Drift rule: ${h.ruleText}` },
      { kind: 'text', size: 8, text: h.loadMeasureNote },
      ...(h.band
        ? [
            {
              kind: 'text' as const,
              size: 8,
              text:
                `Usual band now (${h.band.pointCount} runs, ${h.band.kind === 'mean' ? 'mean rise' : 'straight line'}): ` +
                `expected rise ${fmt(h.band.interceptF)} \u00b0F` +
                `${h.band.kind === 'regression' ? ` + ${h.band.slopeFPerLoad.toFixed(4)} \u00b0F per unit of load` : ''}` +
                `, s = ${fmt(h.band.residualSdF, 2)} \u00b0F on ${h.band.degreesOfFreedom} degrees of freedom; ` +
                `${fmt(h.band.confidence * 100, 0)} % prediction interval, t = ${fmt(h.band.tQuantile, 3)}.`,
            },
          ]
        : []),
      ...this.riseChart(h, clock),
      { kind: 'heading', text: 'Inspections and work on the same timeline' },
      {
        kind: 'table',
        empty: 'None.',
        columns: [{ head: 'Date', width: 60 }, { head: 'Kind', width: 60 }, { head: 'Title', width: 200 }, { head: 'Detail' }],
        rows: h.timeline.map((t) => {
          const tone = t.attention ? ('danger' as const) : undefined;
          const kind = t.type === 'run' ? 'Run' : t.type === 'inspection' ? 'Inspection' : 'Work';
          return [date(t.at), kind, t.title, t.detail].map((text) => ({ text, tone }));
        }),
      },
    ];
    for (const i of h.inspections.filter((x) => x.findings))
      blocks.push({ kind: 'subheading', text: `Findings, ${date(i.inspectedAt)}: ${i.title}` }, { kind: 'text', text: i.findings });
    blocks.push(
      { kind: 'space', size: 8 },
      {
        kind: 'text',
        size: 8,
        tone: 'muted',
        text: RECORD_DISCLAIMER,
      },
    );
    const { buffer } = await renderRecord({
      title: `Bearing history: ${h.bearing.label}`,
      subtitle:
        `${h.bearing.engineName} \u00b7 ${h.runs.length} runs, ` +
        `${h.inspections.length} inspections, ${h.workRecords.length} work records`,
      works: site.worksName,
      engine: h.bearing.engineName,
      timeZone: site.timeZone,
      printedAt,
      printedBy,
      landscape: true,
      subject: 'Bearing history report',
      blocks,
    });
    return { filename: `${fileStem(h)}.pdf`, buffer };
  }
}
