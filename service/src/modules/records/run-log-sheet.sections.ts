import {
  ALARM_KIND_WORDS,
  ALARM_STATE_WORDS,
  CYLINDER_END_LABELS,
  RUN_PURPOSE_LABELS,
  RUN_STATE_LABELS,
  TRACE_ORIGIN_LABELS,
  type AlarmDto,
  type CardSetDto,
  type CylinderEnd,
  type ChecklistDetail,
  type EngineDetail,
  type ReadingDto,
  type RunDetail,
  type TraceOrigin,
} from '@crankjournal/shared-types';
import { unitLabel } from '../../calculations/units.js';
import { RECORD_DISCLAIMER, type Block, type CellInput } from '../../common/pdf/record-document.js';
import type { ZonedClock } from '../../common/pdf/zoned-time.js';
import type { SiteSettingsView } from '../site/site.service.js';

// The run log sheet's sections: pure functions of a context, kept apart from the service so that they can be
// read (and tested) without the modules the service gathers the context from.
/** Everything a section of the log sheet may print from. */
export interface LogSheetContext {
  run: RunDetail;
  engine: EngineDetail;
  readings: ReadingDto[];
  alarms: AlarmDto[];
  checklists: ChecklistDetail[];
  cardSets: CardSetDto[];
  site: SiteSettingsView;
  clock: ZonedClock;
  /** The alarm system's own figures for the run, against the standards' targets (rows from AlarmsService). */
  alarmFigures: { label: string; value: string; target: string }[];
}

/** One section of the sheet: its blocks, in the order the sections are listed. */
export type LogSheetSection = (c: LogSheetContext) => Block[];

const endWord = (end: CylinderEnd) => CYLINDER_END_LABELS[end].toLowerCase();
const num = (v: number) => String(+v.toFixed(2));
/** As many point columns as read well on a landscape sheet; more points go into a further table. */
const POINTS_PER_TABLE = 11;

const facts: LogSheetSection = ({ run, clock, engine }) => [
  { kind: 'heading', text: 'The run' },
  {
    kind: 'facts',
    columns: 3,
    items: [
      { label: 'Purpose', value: RUN_PURPOSE_LABELS[run.purpose] },
      { label: 'State', value: RUN_STATE_LABELS[run.state] },
      { label: 'Engine', value: engine.name },
      { label: 'Started', value: clock.dateTime(run.startedAt) },
      { label: 'Stopped', value: clock.dateTime(run.stoppedAt) },
      { label: 'Closed', value: clock.dateTime(run.closedAt) },
      { label: 'Running time', value: `${(run.runningSeconds / 3600).toFixed(2)} h` },
      { label: 'Revolutions', value: String(Math.round(run.revolutions)) },
      { label: 'Crew', value: run.crew.map((c) => c.displayName).join(', ') },
    ],
  },
  ...(run.notes ? [{ kind: 'text', text: `Notes: ${run.notes}` } as Block] : []),
  ...(run.abandonedReason ? [{ kind: 'text', text: `Abandoned: ${run.abandonedReason}`, tone: 'danger' } as Block] : []),
];

const history: LogSheetSection = ({ run, clock }) => [
  { kind: 'heading', text: 'State history' },
  {
    kind: 'table',
    columns: [
      { head: 'When', width: 110 },
      { head: 'From', width: 90 },
      { head: 'To', width: 90 },
      { head: 'By', width: 130 },
      { head: 'Note' },
    ],
    rows: run.history.map((h) => [
      clock.dateTime(h.at),
      h.from ? RUN_STATE_LABELS[h.from] : '\u2014',
      RUN_STATE_LABELS[h.to],
      h.byName,
      h.note ?? '',
    ]),
  },
];

const readings: LogSheetSection = ({ readings: all, engine, clock, run }) => {
  const points = [...engine.measurementPoints].sort((a, b) => a.sequence - b.sequence);
  // Rounds: readings of the same minute share a row; a second reading of a point in that minute starts a new row.
  const rounds: { at: string; cells: Map<string, ReadingDto> }[] = [];
  const open = new Map<string, (typeof rounds)[number]>();
  for (const r of all) {
    const key = r.takenAt.slice(0, 16);
    let row = open.get(key);
    if (!row || row.cells.has(r.pointId)) {
      row = { at: r.takenAt, cells: new Map() };
      rounds.push(row);
      open.set(key, row);
    }
    row.cells.set(r.pointId, r);
  }
  const zone = clock.zoneName(run.startedAt ?? run.createdAt);
  const blocks: Block[] = [{ kind: 'heading', text: `Readings (${all.length}, in time order)` }];
  if (!all.length) return [...blocks, { kind: 'text', text: 'No readings.', tone: 'muted' }];
  let lastDay = '';
  const timeCell = (at: string) => {
    const day = clock.date(at);
    const t = day === lastDay ? clock.time(at) : `${day.slice(0, 6)} ${clock.time(at)}`;
    lastDay = day;
    return t;
  };
  for (let g = 0; g < points.length; g += POINTS_PER_TABLE) {
    const cols = points.slice(g, g + POINTS_PER_TABLE);
    lastDay = '';
    if (points.length > POINTS_PER_TABLE)
      blocks.push({ kind: 'subheading', text: `Points ${g + 1} to ${g + cols.length} of ${points.length}` });
    blocks.push({
      kind: 'table',
      columns: [
        { head: `Time (${zone})`, width: 62 },
        ...cols.map((p) => ({ head: `${p.code} ${unitLabel(p.unit)}`, align: 'right' as const })),
      ],
      rows: rounds
        .filter((r) => cols.some((p) => r.cells.has(p.id)))
        .map((r) => [
          timeCell(r.at),
          ...cols.map((p): CellInput => {
            const c = r.cells.get(p.id);
            if (!c) return '';
            return c.originalValue !== null ? { text: `${num(c.value)} *`, original: num(c.originalValue), bold: true } : num(c.value);
          }),
        ]),
    });
  }
  blocks.push({
    kind: 'text',
    size: 8,
    tone: 'muted',
    text: '* amended: the value now on record, with the value first recorded struck through under it; every amendment is listed below.',
  });
  const amended = all.filter((r) => r.amendments.length);
  const code = new Map(points.map((p) => [p.id, `${p.code} ${p.label}`]));
  blocks.push({ kind: 'subheading', text: 'Amendments' });
  blocks.push({
    kind: 'table',
    empty: 'No reading was amended.',
    columns: [
      { head: 'Reading taken', width: 90 },
      { head: 'Point', width: 150 },
      { head: 'Was', width: 50, align: 'right' },
      { head: 'Now', width: 50, align: 'right' },
      { head: 'Reason' },
      { head: 'By', width: 110 },
      { head: 'When', width: 100 },
    ],
    rows: amended.flatMap((r) =>
      r.amendments.map((a) => [
        clock.dateTime(r.takenAt),
        code.get(r.pointId) ?? '',
        num(a.oldValue),
        num(a.newValue),
        a.reason,
        a.byName,
        clock.dateTime(a.at),
      ]),
    ),
  });
  return blocks;
};

const alarms: LogSheetSection = ({ alarms: list, clock }) => [
  { kind: 'heading', text: 'Alarms' },
  {
    kind: 'table',
    empty: 'No alarm was raised.',
    columns: [
      { head: 'Raised', width: 92 },
      { head: 'Alarm' },
      { head: 'Value / limit', width: 80, align: 'right' },
      { head: 'Acknowledged', width: 140 },
      { head: 'Returned to normal', width: 92 },
      { head: 'Shelved', width: 120 },
      { head: 'State now', width: 70 },
    ],
    rows: [...list]
      .sort((a, b) => a.raisedAt.localeCompare(b.raisedAt))
      .map((a) => [
        clock.dateTime(a.raisedAt),
        {
          text:
            `${a.priority === 'advisory' ? 'Pre-alarm (advisory), ' : ''}${ALARM_KIND_WORDS[a.kind]}: ${a.pointLabel}. ${a.message}` +
            (a.forecast
              ? ` Forecast: ${ALARM_KIND_WORDS[a.forecast.limitKind].toLowerCase()} in ${num(a.forecast.minutesToLimit)} min` +
                ` at ${num(a.forecast.ratePerMin)} ${unitLabel(a.unit)}/min.`
              : '') +
            (a.suppression ? ` (suppressed by ${a.suppressedByLabel ?? a.suppression})` : ''),
          tone: a.priority === 'high_high' ? 'danger' : a.priority === 'advisory' ? 'normal' : 'warning',
        },
        a.value !== null ? `${num(a.value)}${a.limit !== null ? ` / ${num(a.limit)}` : ''} ${unitLabel(a.unit)}` : '\u2014',
        a.acknowledgedAt ? `${a.acknowledgedByName ?? ''}, ${clock.dateTime(a.acknowledgedAt)}` : 'not acknowledged',
        a.returnedAt ? clock.dateTime(a.returnedAt) : '\u2014',
        a.shelvedUntil ? `until ${clock.dateTime(a.shelvedUntil)} by ${a.shelvedByName ?? ''}: ${a.shelveReason ?? ''}` : '\u2014',
        ALARM_STATE_WORDS[a.state],
      ]),
  },
];

const alarmFigures: LogSheetSection = ({ alarmFigures: rows }) => [
  { kind: 'heading', text: 'Alarm system figures' },
  {
    kind: 'table',
    empty: 'No figures: the run has no alarm period yet.',
    columns: [{ head: 'Figure' }, { head: 'This run', width: 140, align: 'right' }, { head: 'Target', width: 220 }],
    rows: rows.map((r) => [r.label, r.value, r.target]),
  },
];

const checklists: LogSheetSection = ({ checklists: list, clock }) => {
  const labelOf = (c: ChecklistDetail, key: string) => c.sections.flatMap((s) => s.items).find((i) => i.key === key)?.label ?? key;
  return [
    { kind: 'heading', text: 'Checklists' },
    {
      kind: 'table',
      empty: 'No checklist was filled for this run.',
      columns: [
        { head: 'Checklist', width: 150 },
        { head: 'Started', width: 150 },
        { head: 'Signed', width: 150 },
        { head: 'Items done', width: 60, align: 'right' },
        { head: 'Overrides and amendments' },
      ],
      rows: list.map((c) => {
        const notes = c.entries.flatMap((e) => [
          ...(e.override
            ? [
                `${labelOf(c, e.itemKey)}: out of range, accepted by ${e.override.byName} ` +
                  `${clock.dateTime(e.override.at)}: ${e.override.reason}`,
              ]
            : []),
          ...e.amendments.map((a) => `${labelOf(c, e.itemKey)}: amended by ${a.byName} ${clock.dateTime(a.at)}: ${a.reason}`),
        ]);
        return [
          `${c.name} (version ${c.version})`,
          `${c.startedByName}, ${clock.dateTime(c.startedAt)}`,
          c.signedAt ? `${c.signedByName ?? ''}, ${clock.dateTime(c.signedAt)}` : { text: 'not signed', tone: 'warning' },
          `${c.totalDone} of ${c.totalItems}`,
          notes.join('\n') || '\u2014',
        ];
      }),
    },
  ];
};

const missingEnds = (s: CardSetDto) => s.results.missingEnds.map((m) => `${m.cylinderLabel} ${endWord(m.end)}`).join(', ');

/** How a set's traces were made, e.g. "; 3 traced automatically, accepted, 1 traced by hand" (empty when no card says). */
function traceOrigins(s: CardSetDto): string {
  const counts = new Map<TraceOrigin, number>();
  for (const c of s.cards) if (c.traceOrigin) counts.set(c.traceOrigin, (counts.get(c.traceOrigin) ?? 0) + 1);
  return counts.size ? `; ${[...counts].map(([o, n]) => `${n} ${TRACE_ORIGIN_LABELS[o]}`).join(', ')}` : '';
}

const cardSets: LogSheetSection = ({ cardSets: sets, clock }) => [
  { kind: 'heading', text: 'Indicator card sets' },
  {
    kind: 'table',
    empty: 'No indicator cards were taken on this run.',
    columns: [
      { head: 'Taken', width: 100 },
      { head: 'Speed rpm', width: 55, align: 'right' },
      { head: 'Cylinders (indicated hp)' },
      { head: 'Total IHP', width: 60, align: 'right' },
      { head: 'Cards', width: 200 },
      { head: 'Entered by', width: 100 },
    ],
    rows: sets.map((s) => [
      clock.dateTime(s.takenAt),
      num(s.speedRpm),
      s.results.cylinders.map((c) => `${c.label} ${c.indicatedHorsepower.toFixed(1)}`).join(', ') || '\u2014',
      { text: s.results.totalIndicatedHorsepower.toFixed(1), bold: true },
      s.results.complete
        ? `complete: every end of every cylinder has a card${traceOrigins(s)}`
        : {
            text: `incomplete: no card for ${missingEnds(s)}${traceOrigins(s)}`,
            tone: 'warning',
          },
      s.createdByName,
    ]),
  },
];

const close: LogSheetSection = ({ run, clock, site }) => [
  { kind: 'heading', text: 'Close and countersignature' },
  {
    kind: 'facts',
    items: [
      { label: 'Closed', value: run.closedAt ? clock.dateTime(run.closedAt) : 'not closed' },
      {
        label: 'Countersigned',
        value: run.countersignedByName
          ? `${run.countersignedByName} (chief engineer), ${clock.dateTime(run.countersignedAt)}`
          : 'not yet countersigned',
      },
    ],
  },
  ...(site.wetSignature
    ? ([
        { kind: 'space', size: 6 },
        { kind: 'subheading', text: 'Signed on paper' },
        {
          kind: 'writeIn',
          fields: [
            { label: 'Chief engineer', share: 0.4 },
            { label: 'Signature', share: 0.35 },
            { label: 'Date', share: 0.25 },
          ],
        },
        {
          kind: 'writeIn',
          fields: [
            { label: 'Inspector or trustee', share: 0.4 },
            { label: 'Signature', share: 0.35 },
            { label: 'Date', share: 0.25 },
          ],
        },
      ] as Block[])
    : []),
  { kind: 'space', size: 8 },
  { kind: 'text', text: RECORD_DISCLAIMER, size: 8, tone: 'muted' },
];

/** The sections of the sheet, in order. A new section is a function added here. */
export const LOG_SHEET_SECTION = { facts, history, readings, alarms, checklists, cardSets, close };
export const LOG_SHEET_SECTIONS: LogSheetSection[] = [facts, history, readings, alarms, alarmFigures, checklists, cardSets, close];
