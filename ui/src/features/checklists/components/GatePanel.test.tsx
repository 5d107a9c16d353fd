import userEvent from '@testing-library/user-event';
import type { RunState } from '@crankjournal/shared-types';
import { render, screen, within } from '../../../test-utils/render';
import { buildRun } from '../../../test-utils/builders';
import { json, signIn, signOut, stubFetch } from '../../../test-utils/http';
import { GatePanel } from './GatePanel';

const run = (state: RunState) => buildRun({ state });

describe('GatePanel', () => {
  afterEach(() => {
    vi.restoreAllMocks();
    signOut();
  });

  it('shows the countdown of the pre-lube window while the run is cleared', async () => {
    signIn('operator');
    const until = new Date(Date.now() + 12 * 60_000 + 30_000).toISOString();
    stubFetch({ '*': () => json({ allowed: true, reasons: [], preLubeFreshUntil: until }) });
    render(<GatePanel run={run('cleared')} />);
    expect(await screen.findByTestId('pre-lube-remaining')).toHaveTextContent(/^12:(30|29)$/);
    expect(screen.getByTestId('gate-clear')).toBeInTheDocument();
    expect(screen.getByRole('button', { name: 'Start engine' })).toBeInTheDocument();
  });

  it('shows the server’s refusal with every reason when a start is refused', async () => {
    const user = userEvent.setup();
    signIn('operator');
    stubFetch({
      '*': () =>
        json(
          {
            statusCode: 409,
            error: 'Conflict',
            message: ['stale'],
            details: {
              allowed: false,
              reasons: [{ code: 'pre_lube_stale', message: 'The pre-lube sign-off (Pre-lube) is 31 min old.', subject: 'Pre-lube' }],
              preLubeFreshUntil: null,
            },
          },
          409,
        ),
      '*/start-gate': () => json({ allowed: true, reasons: [], preLubeFreshUntil: new Date(Date.now() + 60_000).toISOString() }),
    });
    render(<GatePanel run={run('cleared')} />);
    await user.click(await screen.findByRole('button', { name: 'Start engine' }));
    await user.click(within(await screen.findByRole('dialog')).getByRole('button', { name: 'Start engine' }));
    const refused = await screen.findByTestId('start-refused');
    expect(refused).toHaveTextContent('Start refused');
    expect(refused).toHaveTextContent('The pre-lube sign-off (Pre-lube) is 31 min old.');
  }, 20_000);

  it('does not tell an observer about their own missing start qualification, nor offer a start', async () => {
    signIn('observer');
    stubFetch({
      '*': {
        allowed: false,
        reasons: [
          { code: 'qualification_missing', message: 'You hold no start and run qualification for No. 2 engine.' },
          { code: 'checklist_missing', message: 'Pre-lube: no checklist has been started for this run.', subject: 'Pre-lube' },
        ],
      },
    });
    render(<GatePanel run={run('cleared')} />);
    const reasons = await screen.findByTestId('gate-reasons');
    expect(reasons).toHaveTextContent('Pre-lube: no checklist has been started');
    expect(reasons).not.toHaveTextContent('start and run qualification');
    expect(screen.queryByRole('button', { name: 'Start engine' })).toBeNull();
  });

  it('shows nothing once the run is running', () => {
    signIn('operator');
    stubFetch({ '*': () => json({ allowed: true, reasons: [] }) });
    render(<GatePanel run={run('running')} />);
    expect(screen.queryByTestId('gate-panel')).toBeNull();
  });
});
