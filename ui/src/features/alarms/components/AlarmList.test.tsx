import userEvent from '@testing-library/user-event';
import type { AlarmDto } from '@crankjournal/shared-types';
import { render, screen } from '../../../test-utils/render';
import { AlarmList } from './AlarmList';
import { AlarmBanner } from './AlarmBanner';

const base: AlarmDto = {
  id: 'hh',
  engineId: 'e',
  runId: 'r',
  pointId: 'p-mb2',
  pointLabel: 'Main bearing 2 temperature',
  kind: 'high_high',
  priority: 'high_high',
  state: 'active_unacknowledged',
  conditionActive: true,
  message: 'Main bearing 2 temperature 152 °F is above its high-high limit 145 °F.',
  value: 152,
  limit: 145,
  unit: 'degF',
  raisedAt: '2026-06-13T10:00:00Z',
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
  updatedAt: '2026-06-13T10:00:00Z',
};
const suppressed = (id: string, kind: AlarmDto['kind']): AlarmDto => ({
  ...base,
  id,
  kind,
  priority: 'high',
  message: `${kind} message`,
  suppression: 'design',
  suppressedById: 'hh',
  suppressedByLabel: 'High-high',
});
const alarms = [base, suppressed('hi', 'high'), suppressed('amb', 'above_ambient')];
const actions = { canAcknowledge: true, canShelve: true, busy: null, onAcknowledge: () => {}, onShelve: () => {}, onUnshelve: () => {} };

describe('suppressed alarms', () => {
  it('the banner shows the one alarm that matters', () => {
    render(<AlarmBanner alarms={alarms} canAcknowledge onAcknowledge={() => {}} acknowledging={null} />);
    expect(screen.getAllByRole('button', { name: /Acknowledge/ })).toHaveLength(1);
    expect(screen.getByText(/high-high limit 145/)).toBeInTheDocument();
  });

  it('the list keeps the suppressed ones a click away, marked "suppressed by High-high"', async () => {
    render(<AlarmList alarms={alarms} actions={actions} />);
    expect(screen.queryByText('high message')).not.toBeInTheDocument();
    await userEvent.click(screen.getByRole('button', { name: 'Show 2 suppressed alarms' }));
    expect(screen.getByText('high message')).toBeInTheDocument();
    expect(screen.getAllByTestId('suppressed-by')[0]).toHaveTextContent('Suppressed by High-high');
  });
});

describe('a pre-alarm (the forecast of a limit)', () => {
  const pre: AlarmDto = {
    ...base,
    id: 'pre',
    kind: 'pre_alarm',
    priority: 'advisory',
    message: 'Main bearing 2 temperature: high (130 °F) in about 4 min at the present trend',
    value: 124,
    limit: 130,
    forecast: { limitKind: 'high', minutesToLimit: 4.2, ratePerMin: 1.4 },
  };

  it('comes after every alarm in the banner, as an advisory with an outline, not a fill', () => {
    render(
      <AlarmBanner
        alarms={[pre, { ...base, id: 'h', kind: 'high', priority: 'high' }]}
        canAcknowledge
        onAcknowledge={() => {}}
        acknowledging={null}
      />,
    );
    const rows = screen.getByTestId('alarm-banner').querySelectorAll('[data-priority]');
    expect([...rows].map((r) => r.getAttribute('data-priority'))).toEqual(['high', 'advisory']);
    expect(screen.getByText(/PRE-ALARM \(ADVISORY\) · Main bearing 2 temperature · Limit forecast/)).toBeInTheDocument();
  });

  it('the list names it advisory', () => {
    render(<AlarmList alarms={[pre]} actions={actions} />);
    expect(screen.getByText(/Pre-alarm \(advisory\) · Main bearing 2 temperature · Limit forecast/)).toBeInTheDocument();
  });
});
