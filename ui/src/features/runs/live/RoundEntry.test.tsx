import userEvent from '@testing-library/user-event';
import type { IngestResult, RoundRequest } from '@crankjournal/shared-types';
import { render, screen, waitFor } from '../../../test-utils/render';
import { Outbox, type OutboxRequest, type OutboxState } from '../../../api/outbox';
import { RoundEntry, type RoundPoint } from './RoundEntry';

// Limits of the demo engine's bearing and throttle points (invented demo data, not a source value).
const points: RoundPoint[] = [
  {
    id: 'p-mb1',
    code: 'MB1-T',
    label: 'Main bearing 1',
    kind: 'bearing_temperature',
    unit: 'degF',
    sequence: 20,
    normalLow: 90,
    normalHigh: 160,
    highLimit: 180,
    highHighLimit: 200,
  },
  {
    id: 'p-thr',
    code: 'THR-P',
    label: 'Throttle pressure',
    kind: 'throttle_pressure',
    unit: 'psig',
    sequence: 10,
    normalLow: 120,
    normalHigh: 140,
    highLimit: 145,
    highHighLimit: null,
  },
];

function setup(send = vi.fn<(req: OutboxRequest) => Promise<IngestResult>>()) {
  let saved: OutboxState | undefined;
  const persistence = { load: () => Promise.resolve(saved), save: (s: OutboxState) => Promise.resolve(void (saved = s)) };
  const queue = new Outbox({ send, persistence });
  render(
    <RoundEntry
      runId="run-1"
      points={points}
      previous={{ 'p-mb1': { value: 151, takenAt: '2025-06-14T10:00:00Z' } }}
      engine={{ mawpPsig: 150 }}
      queue={queue}
    />,
  );
  return { send, queue };
}

beforeEach(() => localStorage.clear());

describe('RoundEntry', () => {
  it('walks the points in round order with the previous value and normal range beside each field', () => {
    setup();
    const fields = screen.getAllByRole('textbox');
    expect(fields[0]).toHaveAccessibleName('Throttle pressure (psig)');
    expect(fields[1]).toHaveAccessibleName('Main bearing 1 (°F)');
    expect(fields[1]).toHaveAttribute('inputmode', 'decimal');
    expect(screen.getByTestId('round-row-MB1-T')).toHaveTextContent('151 °F');
    expect(screen.getByTestId('round-row-MB1-T')).toHaveTextContent('Normal 90–160 °F');
  });

  it('marks a value above high-high in red and one above high in amber before anything is saved', async () => {
    const user = userEvent.setup();
    const { send } = setup();
    const bearing = screen.getByLabelText('Main bearing 1 (°F)');

    await user.clear(bearing);
    await user.type(bearing, '205');
    expect(screen.getByTestId('round-row-MB1-T')).toHaveAttribute('data-standing', 'high_high');
    expect(screen.getByTestId('round-standing-MB1-T')).toHaveTextContent('High-high');
    expect(screen.getByTestId('round-row-MB1-T').getAttribute('style')).toContain('--mantine-color-signal-6');
    expect(bearing).toHaveAccessibleDescription(/High-high/);

    await user.clear(bearing);
    await user.type(bearing, '185');
    expect(screen.getByTestId('round-row-MB1-T')).toHaveAttribute('data-standing', 'high');
    expect(screen.getByTestId('round-standing-MB1-T')).toHaveTextContent(/^High —/);
    expect(screen.getByTestId('round-row-MB1-T').getAttribute('style')).toContain('--mantine-color-amber-6');

    await user.clear(bearing);
    await user.type(bearing, '150');
    expect(screen.getByTestId('round-row-MB1-T')).toHaveAttribute('data-standing', 'normal');
    expect(screen.queryByTestId('round-standing-MB1-T')).toBeNull();

    expect(send).not.toHaveBeenCalled();
  });

  it('treats a steam pressure above the engine’s maximum allowable working pressure as high-high', async () => {
    const user = userEvent.setup();
    setup();
    await user.clear(screen.getByLabelText('Throttle pressure (psig)'));
    await user.type(screen.getByLabelText('Throttle pressure (psig)'), '152');
    expect(screen.getByTestId('round-row-THR-P')).toHaveAttribute('data-standing', 'high_high');
  });

  it('refuses to save a value that is not a number', async () => {
    const user = userEvent.setup();
    setup();
    await user.clear(screen.getByLabelText('Main bearing 1 (°F)'));
    await user.type(screen.getByLabelText('Main bearing 1 (°F)'), '15o');
    expect(screen.getByText(/Not a number/)).toBeInTheDocument();
    expect(screen.getByRole('button', { name: 'Save round' })).toBeDisabled();
  });

  it('saves the entered points in one request, each reading with its own clientId', async () => {
    const user = userEvent.setup();
    const send = vi.fn(async (req: OutboxRequest) => ({
      stored: (req.body as RoundRequest).readings.length,
      duplicates: 0,
      rejected: [],
      rejectedCount: 0,
      alarmsRaised: 0,
    }));
    setup(send);
    await user.clear(screen.getByLabelText('Throttle pressure (psig)'));
    await user.type(screen.getByLabelText('Throttle pressure (psig)'), '131,5');
    await user.clear(screen.getByLabelText('Main bearing 1 (°F)'));
    await user.type(screen.getByLabelText('Main bearing 1 (°F)'), '152');
    await user.click(screen.getByRole('button', { name: 'Save round' }));
    await waitFor(() => expect(send).toHaveBeenCalledTimes(1));
    const [req] = send.mock.calls[0];
    const round = req.body as RoundRequest;
    expect(req.path).toBe('/runs/run-1/rounds');
    expect(round.readings.map((r) => [r.pointId, r.value])).toEqual([
      ['p-thr', 131.5],
      ['p-mb1', 152],
    ]);
    expect(new Set(round.readings.map((r) => r.clientId)).size).toBe(2);
    expect(round.readings.every((r) => r.takenAt === round.takenAt)).toBe(true);
  });
});
