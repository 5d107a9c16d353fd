import type { RunSummary } from '@crankjournal/shared-types';
import { engineStateWord, whoClears } from './ShiftNow';

const run = (state: RunSummary['state']): RunSummary => ({
  id: 'r',
  engineId: 'e',
  engineName: 'Engine',
  purpose: 'demonstration' as RunSummary['purpose'],
  state,
  title: 'Run',
  plannedFor: null,
  startedAt: null,
  stoppedAt: null,
  closedAt: null,
  runningSeconds: 0,
  revolutions: 0,
  openAlarms: 0,
});

// The shift board's words (common practice, no source).
describe('the shift board', () => {
  it('says the engine is running, preparing or at rest', () => {
    expect(engineStateWord(run('running'))).toBe('Running');
    expect(engineStateWord(run('cleared'))).toBe('Preparing');
    expect(engineStateWord(run('planned'))).toBe('At rest');
    expect(engineStateWord(undefined)).toBe('At rest');
  });
  it('names who can clear each reason of the start gate', () => {
    expect(whoClears({ code: 'qualification_expired', message: '' })).toMatch(/chief engineer/);
    expect(whoClears({ code: 'checklist_unsigned', message: '' })).toMatch(/operator/);
    expect(whoClears({ code: 'active_high_high_alarm', message: '' })).toMatch(/acknowledges/);
  });
});
