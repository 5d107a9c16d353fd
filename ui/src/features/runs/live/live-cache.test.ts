import { QueryClient } from '@tanstack/react-query';
import type { AlarmDto, BoardPoint, ReadingDto } from '@crankjournal/shared-types';
import { runKeys } from '../api/runs.api';
import { upsertAlarm } from '../../alarms/api/alarms.api';
import { bannerOrder } from '../../alarms/components/AlarmBanner';
import { advanceBoard, applyReadings, mergeReadings } from './live-cache';
import { previewCsv } from './CsvImport';
import { limitStanding, parseEntered } from './round-check';

const reading = (id: string, pointId: string, value: number, takenAt: string): ReadingDto => ({
  id,
  clientId: `c-${id}`,
  runId: 'run-1',
  pointId,
  value,
  originalValue: null,
  unit: 'degF',
  takenAt,
  source: 'round',
  enteredByName: 'Op',
  amendments: [],
});

const alarm = (over: Partial<AlarmDto>): AlarmDto => ({
  id: 'a1',
  engineId: 'e',
  runId: 'run-1',
  pointId: 'p1',
  pointLabel: 'Main bearing 1',
  kind: 'high',
  priority: 'high',
  state: 'active_unacknowledged',
  conditionActive: true,
  message: 'm',
  value: 185,
  limit: 180,
  unit: 'degF',
  raisedAt: '2025-06-14T10:00:00Z',
  acknowledgedAt: null,
  acknowledgedByName: null,
  returnedAt: null,
  shelvedUntil: null,
  shelveReason: null,
  shelvedByName: null,
  suppression: null,
  suppressedById: null,
  suppressedByLabel: null,
  forecast: null,
  updatedAt: '2025-06-14T10:00:00Z',
  ...over,
});

describe('live cache updates', () => {
  it('adds new readings once each, in time order', () => {
    const list = [reading('1', 'p1', 150, '2025-06-14T10:00:00Z')];
    const merged = mergeReadings(list, [
      reading('3', 'p1', 152, '2025-06-14T10:20:00Z'),
      reading('2', 'p1', 151, '2025-06-14T10:10:00Z'),
      reading('1', 'p1', 150, '2025-06-14T10:00:00Z'),
    ]);
    expect(merged!.map((r) => r.id)).toEqual(['1', '2', '3']);
  });

  it('moves the board on: latest value, trend capped at 20', () => {
    const b: BoardPoint[] = [
      {
        pointId: 'p1',
        value: 150,
        unit: 'degF',
        takenAt: '2025-06-14T10:00:00Z',
        trend: Array.from({ length: 20 }, (_, i) => i),
        alarmState: null,
        alarmPriority: null,
      },
    ];
    const next = advanceBoard(b, [reading('2', 'p1', 153, '2025-06-14T10:10:00Z')])!;
    expect(next[0].value).toBe(153);
    expect(next[0].trend).toHaveLength(20);
    expect(next[0].trend.at(-1)).toBe(153);
    // An older reading arriving late does not replace the latest value.
    expect(advanceBoard(next, [reading('0', 'p1', 140, '2025-06-14T09:00:00Z')])![0].value).toBe(153);
  });

  it('applies a readings:new event to every cached readings query of the run and to its board', () => {
    const qc = new QueryClient();
    qc.setQueryData(runKeys.readings('run-1'), [reading('1', 'p1', 150, '2025-06-14T10:00:00Z')]);
    qc.setQueryData(runKeys.board('run-1'), [
      { pointId: 'p1', value: 150, unit: 'degF', takenAt: '2025-06-14T10:00:00Z', trend: [150], alarmState: null, alarmPriority: null },
    ]);
    applyReadings(qc, 'run-1', { runId: 'run-1', readings: [reading('2', 'p1', 155, '2025-06-14T10:10:00Z')] });
    applyReadings(qc, 'run-1', { runId: 'run-2', readings: [reading('9', 'p1', 999, '2025-06-14T10:20:00Z')] });
    expect(qc.getQueryData<ReadingDto[]>(runKeys.readings('run-1'))!.map((r) => r.value)).toEqual([150, 155]);
    expect(qc.getQueryData<BoardPoint[]>(runKeys.board('run-1'))![0].trend).toEqual([150, 155]);
  });

  it('replaces an alarm by id but ignores an older copy arriving late', () => {
    const list = [alarm({})];
    const acked = alarm({ state: 'active_acknowledged', updatedAt: '2025-06-14T10:05:00Z' });
    const after = upsertAlarm(list, acked)!;
    expect(after[0].state).toBe('active_acknowledged');
    expect(upsertAlarm(after, alarm({}))![0].state).toBe('active_acknowledged');
    expect(upsertAlarm(after, alarm({ id: 'a2' }))!).toHaveLength(2);
  });

  it('puts high-high before high in the banner', () => {
    const list = [alarm({ id: 'h' }), alarm({ id: 'hh', priority: 'high_high', raisedAt: '2025-06-14T09:00:00Z' })];
    expect([...list].sort(bannerOrder).map((a) => a.id)).toEqual(['hh', 'h']);
  });
});

describe('CSV preview', () => {
  it('reads the header and first rows, and says which required column is missing', () => {
    const ok = previewCsv('taken_at,point,value,unit\n2025-06-14T10:00:00Z,MB1-T,151,degF\n2025-06-14T10:00:05Z,MB2-T,149,degF\n');
    expect(ok.header).toEqual(['taken_at', 'point', 'value', 'unit']);
    expect(ok.rows).toHaveLength(2);
    expect(ok.missing).toEqual([]);
    const bad = previewCsv('time,point,reading\n10:00,MB1-T,151\n');
    expect(bad.missing).toEqual(['taken_at', 'value']);
    expect(bad.unknown).toEqual(['time', 'reading']);
  });
});

describe('round checks', () => {
  it('follows the server: strictly above a limit is in alarm, at the limit is not', () => {
    const p = { highLimit: 180, highHighLimit: 200, lowLimit: 40, normalLow: 90, normalHigh: 160 };
    expect(limitStanding(p, 180)).toBe('above_normal');
    expect(limitStanding(p, 180.5)).toBe('high');
    expect(limitStanding(p, 200)).toBe('high');
    expect(limitStanding(p, 201)).toBe('high_high');
    expect(limitStanding(p, 39)).toBe('low');
    expect(limitStanding(p, 60)).toBe('below_normal');
    expect(limitStanding(p, 120)).toBe('normal');
  });
  it('reads a decimal comma and refuses text', () => {
    expect(parseEntered(' 74,5 ')).toBe(74.5);
    expect(parseEntered('')).toBeNull();
    expect(parseEntered('7x')).toBeNaN();
  });
});
