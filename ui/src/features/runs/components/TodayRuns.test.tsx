import type { RunState } from '@crankjournal/shared-types';
import { buildRunSummary } from '../../../test-utils/builders';
import { currentAndNextRuns } from './TodayRuns';

const r = (id: string, state: RunState, plannedFor: string | null = null) =>
  buildRunSummary({ id, engineId: 'e1', state, title: id, plannedFor });

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
