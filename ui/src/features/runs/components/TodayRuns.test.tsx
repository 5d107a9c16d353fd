import type { RunState, RunSummary } from '@crankjournal/shared-types';
import { currentAndNextRuns } from './TodayRuns';

const r = (id: string, state: RunState, plannedFor: string | null = null): RunSummary => ({
  id,
  engineId: 'e1',
  engineName: 'No. 2 engine',
  purpose: 'demonstration',
  state,
  title: id,
  plannedFor,
  startedAt: null,
  stoppedAt: null,
  closedAt: null,
  runningSeconds: 0,
  revolutions: 0,
  openAlarms: 0,
});

describe('runs now and next', () => {
  it('puts a running run first, then runs being prepared, then planned ones by date, and leaves finished runs out', () => {
    const list = [
      r('closed', 'closed', '2026-05-01'),
      r('later', 'planned', '2026-07-01'),
      r('sooner', 'planned', '2026-06-01'),
      r('prep', 'preparing', '2026-05-20'),
      r('run', 'running', '2026-05-19'),
      r('gone', 'abandoned'),
    ];
    expect(currentAndNextRuns(list, 10).map((x) => x.id)).toEqual(['run', 'prep', 'sooner', 'later']);
    expect(currentAndNextRuns(list).length).toBe(3);
  });
});
