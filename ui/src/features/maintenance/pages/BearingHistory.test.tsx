import { Route, Routes } from 'react-router-dom';
import { render, screen, waitFor, within } from '../../../test-utils/render';
import { HISTORY, INSPECTION } from '../../../test-utils/fixtures/maintenance';
import { signIn, signOut, stubFetch } from '../../../test-utils/http';
import BearingHistoryPage from './BearingHistory.page';
import InspectionPage from './Inspection.page';

describe('a bearing’s history', () => {
  beforeEach(() => {
    signIn('observer', { id: 'u1', email: 'o@alderforge.example', displayName: 'Test Observer', unitSystem: 'imperial' });
    stubFetch({
      '*': { imperial: {}, metric: {} },
      '/maintenance/bearings/b2/history': HISTORY,
      '/maintenance/inspections/i1': INSPECTION,
    });
  });
  afterEach(() => {
    vi.restoreAllMocks();
    signOut();
  });

  it('flags the run above the band, states the rule, and leaves the others unflagged', async () => {
    render(
      <Routes>
        <Route path="/maintenance/bearings/:id" element={<BearingHistoryPage />} />
      </Routes>,
      { route: '/maintenance/bearings/b2' },
    );
    await waitFor(() => expect(screen.getByRole('heading', { name: 'Main bearing 2 (flywheel side)' })).toBeInTheDocument());
    expect(screen.getByTestId('bearing-run-r3')).toHaveAttribute('data-flagged', 'true');
    expect(within(screen.getByTestId('bearing-run-r3')).getByTestId('drift-flag')).toHaveTextContent('Drift');
    expect(within(screen.getByTestId('bearing-run-r3')).getByText('High-high')).toBeInTheDocument();
    expect(screen.getByTestId('bearing-run-r2')).toHaveAttribute('data-flagged', 'false');
    expect(within(screen.getByTestId('bearing-run-r1')).getByText(/First run/)).toBeInTheDocument();
    expect(screen.getByTestId('drift-rule')).toHaveTextContent('more than 5 °F above the top of the band');
    // The band is a prediction interval with the history's degrees of freedom; too few runs are said so.
    expect(within(screen.getByTestId('bearing-run-r3')).getByTestId('drift-band')).toHaveTextContent(
      '95 % band ± 2.9 °F from 3 runs (2 degrees of freedom, t = 4.30)',
    );
    expect(screen.getByTestId('bearing-run-r2')).toHaveTextContent('Too few runs to judge: 1 earlier run, at least 3 are needed.');
    expect(screen.getByTestId('drift-summary')).toHaveTextContent('August demonstration');
    // Observers read: no button to record anything.
    expect(screen.queryByRole('link', { name: /Record an inspection/ })).not.toBeInTheDocument();
    const timeline = screen.getByTestId('bearing-timeline');
    expect(within(timeline).getByRole('link', { name: 'Main bearing 2 after the August hot run' })).toHaveAttribute(
      'href',
      '/maintenance/inspections/i1',
    );
  });

  it('an inspection marks the measurement out of tolerance and by how much', async () => {
    render(
      <Routes>
        <Route path="/maintenance/inspections/:id" element={<InspectionPage />} />
      </Routes>,
      { route: '/maintenance/inspections/i1' },
    );
    await waitFor(() => expect(screen.getByText('3 out of tolerance')).toBeInTheDocument());
    const bad = screen.getByTestId('out-of-tolerance');
    expect(bad).toHaveTextContent(/above by 0.0070 in/);
    expect(screen.getAllByTestId('out-of-tolerance')).toHaveLength(1);
    expect(screen.getByText('Within')).toBeInTheDocument();
    expect(screen.getByTestId('findings')).toHaveTextContent('Scored.');
    expect(screen.getAllByText(/licensed practice/).length).toBeGreaterThan(0);
  });
});
