import { Route, Routes } from 'react-router-dom';
import type { LimitChangeDto, UnitConversionTable } from '@crankjournal/shared-types';
import { render, screen, within } from '../../../test-utils/render';
import { buildEngine } from '../../../test-utils/builders';
import { signIn, signOut, stubFetch } from '../../../test-utils/http';
import EngineDetailPage from './EngineDetail.page';

const engine = buildEngine({
  type: 'tandem_compound',
  runningHours: 12.5,
  revolutions: 56250,
  measurementPoints: [
    { id: 'p1', code: 'MB1-T', label: 'Main bearing 1', kind: 'bearing_temperature', unit: 'degF', sequence: 1, highLimit: 212 },
  ],
});
const changes: LimitChangeDto[] = [
  {
    id: 'c1',
    engineId: 'e1',
    subject: 'MB1-T Main bearing 1',
    field: 'highLimit',
    oldValue: 130,
    newValue: 125,
    changedBy: 'u1',
    changedByName: 'Hester Chief',
    changedAt: '2026-05-01T08:00:00Z',
  },
];
const table: UnitConversionTable = { imperial: {}, metric: { degF: { from: 'degF', to: 'degC', factor: 5 / 9, offset: -17.7778 } } };

describe('engine detail page', () => {
  beforeEach(() => {
    signIn('operator', { id: 'u2', email: 'op@alderforge.example', displayName: 'Operator', unitSystem: 'metric' });
    stubFetch({ '*': engine, '*/limit-changes': changes, '/units/conversions': table });
  });
  afterEach(() => {
    vi.restoreAllMocks();
    signOut();
  });

  it('shows limits in the person’s units, the pressure caution, and each limit change as old struck through → new', async () => {
    render(
      <Routes>
        <Route path="/engines/:id" element={<EngineDetailPage />} />
      </Routes>,
      { route: '/engines/e1' },
    );
    // 212 °F = 100 °C (boiling point of water at one standard atmosphere; common practice, no source).
    expect(await screen.findByText('100.0 °C', {}, { timeout: 8000 })).toBeInTheDocument();
    expect(
      screen.getAllByText(/maximum allowable working pressure is the figure on the boiler’s current certificate/).length,
    ).toBeGreaterThan(0);
    const history = await screen.findByRole('table', { name: 'Changes to limits and settings' });
    expect(within(history).getByText('Hester Chief')).toBeInTheDocument();
    expect(within(history).getByLabelText('old value')).toHaveClass('cj-struck');
    expect(within(history).getByLabelText('old value')).toHaveTextContent('130');
    expect(within(history).getByText('125')).toBeInTheDocument();
    // An operator cannot edit the engine.
    expect(screen.queryByRole('link', { name: /Edit engine/ })).not.toBeInTheDocument();
  }, 20_000);
});
