import userEvent from '@testing-library/user-event';
import type { Role, RunDetail, RunState } from '@crankjournal/shared-types';
import { render, screen, waitFor, within } from '../../../test-utils/render';
import { buildRun } from '../../../test-utils/builders';
import { json, signIn, signOut, stubFetch } from '../../../test-utils/http';
import { RunHeader } from './RunHeader';

const run = (state: RunState, extra: Partial<RunDetail> = {}) =>
  buildRun({ title: 'Open day demonstration', createdAt: '2026-05-01T08:00:00Z', state, ...extra });

function buttonsShown(): string[] {
  const group = screen.queryByRole('group', { name: 'Run actions' });
  if (!group) return [];
  return within(group)
    .getAllByRole('button')
    .map((b) => b.textContent ?? '');
}

describe('RunHeader transition buttons', () => {
  beforeEach(() => {
    stubFetch({
      '*': () => json({ statusCode: 404, error: 'Not Found', message: 'no' }, 404),
      '*/start-gate': { allowed: true, reasons: [] },
    });
  });
  afterEach(() => {
    vi.restoreAllMocks();
    signOut();
  });

  const cases: [RunState, Role, string[]][] = [
    ['planned', 'operator', ['Prepare', 'Abandon']],
    ['preparing', 'operator', ['Abandon']],
    ['preparing', 'chief_engineer', ['Clear to start', 'Abandon']],
    ['cleared', 'chief_engineer', ['Start engine', 'Return to preparing', 'Abandon']],
    ['running', 'operator', ['Stop engine']],
    ['stopped', 'chief_engineer', ['Close and countersign']],
    ['stopped', 'operator', []],
    ['closed', 'chief_engineer', []],
    ['abandoned', 'chief_engineer', []],
    ['running', 'observer', []],
    ['preparing', 'maintenance_lead', []],
    ['cleared', 'administrator', []],
  ];
  it.each(cases)('in state %s a %s sees %j', (state, role, expected) => {
    signIn(role);
    render(<RunHeader run={run(state)} />);
    expect(buttonsShown()).toEqual(expected);
  });

  it('tells an operator that a stopped run waits for the chief engineer', () => {
    signIn('operator');
    render(<RunHeader run={run('stopped')} />);
    expect(screen.getByText(/Waiting for the chief engineer to close and countersign/)).toBeInTheDocument();
  });

  it('asks for a reason before abandoning', async () => {
    const user = userEvent.setup();
    signIn('operator');
    render(<RunHeader run={run('preparing')} />);
    await user.click(screen.getByRole('button', { name: 'Abandon' }));
    const confirm = await screen.findByRole('button', { name: 'Abandon run' });
    expect(confirm).toBeDisabled();
    await user.clear(screen.getByLabelText(/Reason for abandoning/));
    await user.type(screen.getByLabelText(/Reason for abandoning/), 'Boiler inspection not passed');
    expect(confirm).toBeEnabled();
  }, 20_000);

  it('asks the chief engineer for a password or PIN to close, and sends it as the signature', async () => {
    const user = userEvent.setup();
    signIn('chief_engineer');
    const { spy: fetchSpy } = stubFetch({ '*': () => json(run('closed')) });
    render(<RunHeader run={run('stopped')} />);
    await user.click(screen.getByRole('button', { name: 'Close and countersign' }));
    const dialog = await screen.findByRole('dialog');
    expect(dialog).toHaveTextContent(/Records your countersignature/);
    const confirm = within(dialog).getByRole('button', { name: 'Close and countersign' });
    expect(confirm).toBeDisabled();
    await user.clear(screen.getByLabelText('Your password or signing PIN'));
    await user.type(screen.getByLabelText('Your password or signing PIN'), '4821');
    await user.click(confirm);
    await waitFor(() => expect(fetchSpy).toHaveBeenCalled());
    const [url, init] = fetchSpy.mock.calls[0]!;
    expect(String(url)).toBe('/api/runs/run-1/transitions');
    expect(JSON.parse(String(init?.body))).toEqual({ to: 'closed', signature: '4821' });
  }, 20_000);

  it('shows the start gate’s reasons when the server refuses a start (409)', async () => {
    const user = userEvent.setup();
    signIn('operator');
    stubFetch({
      '*': () =>
        json(
          {
            statusCode: 409,
            error: 'Conflict',
            message: 'The run may not start.',
            details: {
              allowed: false,
              reasons: [
                { code: 'checklist_incomplete', message: 'The pre-start checklist is not complete.', subject: 'Pre-start checks v3' },
                { code: 'prelube_stale', message: 'The pre-lube sign-off is no longer fresh.' },
              ],
            },
          },
          409,
        ),
      '*/start-gate': { allowed: true, reasons: [] },
    });
    render(<RunHeader run={run('cleared')} />);
    await user.click(screen.getByRole('button', { name: 'Start engine' }));
    const dialog = await screen.findByRole('dialog');
    await user.click(within(dialog).getByRole('button', { name: 'Start engine' }));
    const alert = await screen.findByRole('alert');
    expect(alert).toHaveTextContent('Start refused');
    expect(alert).toHaveTextContent('The pre-start checklist is not complete.');
    expect(alert).toHaveTextContent('Pre-start checks v3');
    expect(alert).toHaveTextContent('The pre-lube sign-off is no longer fresh.');
  }, 20_000);
});
