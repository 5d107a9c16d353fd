import { render, screen, within, waitFor } from '../../../test-utils/render';
import { plan } from '../../../test-utils/fixtures/maintenance';
import { signIn, signOut, stubFetch } from '../../../test-utils/http';
import { DueList } from './DueList';
import { TodayMaintenance } from './TodayMaintenance';

describe('the due list', () => {
  afterEach(() => {
    vi.restoreAllMocks();
    signOut();
  });

  it('marks an overrun plan by word, with how far over, and a coming-due one apart from the ones in hand', () => {
    render(
      <DueList
        plans={[
          plan('p1', 'Main bearing 1 clearance', 'overrun', -45),
          plan('p2', 'Governor', 'coming_due', 1.4),
          plan('p3', 'Crank webs', 'in_hand', 500),
        ]}
      />,
    );
    const rows = screen.getAllByRole('row').slice(1);
    expect(within(rows[0]).getByText('Overrun')).toBeInTheDocument();
    expect(within(rows[0]).getByText(/45 days over/)).toBeInTheDocument();
    expect(within(rows[1]).getByText('Coming due')).toBeInTheDocument();
    expect(within(rows[1]).getByText(/1 day left/)).toBeInTheDocument();
    expect(within(rows[2]).getByText('In hand')).toBeInTheDocument();
    expect(rows[0]).toHaveAttribute('data-status', 'overrun');
  });

  it('an overrun plan on revolutions with no rate shows no date, only that it is overrun and cannot be dated', () => {
    const p = plan('p1', 'Crosshead guides', 'overrun', -45);
    p.due = { ...p.due, governing: 'revolutions', dueDate: null, dueDateNote: 'overrun on revolutions; when it fell due is not known' };
    render(<DueList plans={[p]} />);
    const cell = screen.getByTestId('due-date');
    expect(cell).toHaveTextContent('—');
    expect(cell).toHaveTextContent('overrun on revolutions; when it fell due is not known');
  });

  it('on the Today screen shows only what needs someone, overrun marked, and bearings that drifted', async () => {
    signIn('maintenance_lead', { id: 'u1', email: 'm@alderforge.example', displayName: 'Test Lead', unitSystem: 'imperial' });
    stubFetch({
      '*': { imperial: {}, metric: {} },
      '/maintenance/due*': {
        items: [plan('p1', 'Main bearing 1 clearance', 'overrun', -45), plan('p3', 'Crank webs', 'in_hand', 500)],
        ruleText: 'Whichever comes first.',
        generatedAt: '2026-12-01T00:00:00Z',
      },
      '/maintenance/bearings*': [
        {
          id: 'b2',
          engineId: 'e1',
          engineName: 'No. 2 engine',
          label: 'Main bearing 2',
          kind: 'main',
          pointCodes: ['MB2-T'],
          runCount: 6,
          lastRunAt: null,
          latestRunDrift: true,
          driftRuns: 1,
          lastInspectionAt: null,
        },
      ],
    });
    render(<TodayMaintenance />);
    await waitFor(() => expect(screen.getByText('Main bearing 1 clearance')).toBeInTheDocument());
    expect(screen.getByTestId('due-overrun')).toHaveTextContent('Overrun');
    expect(screen.queryByText('Crank webs')).not.toBeInTheDocument();
    await waitFor(() => expect(screen.getByRole('link', { name: 'Main bearing 2' })).toHaveAttribute('href', '/maintenance/bearings/b2'));
    expect(screen.getByTestId('drift-flag')).toHaveTextContent('Drift');
  });
});
