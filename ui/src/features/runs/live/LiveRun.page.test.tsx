import { Route, Routes } from 'react-router-dom';
import type { AlarmDto, BoardPoint, Role } from '@crankjournal/shared-types';
import { render, screen, within } from '../../../test-utils/render';
import { buildEngine, buildRun } from '../../../test-utils/builders';
import { signIn as signInAs, signOut, stubFetch } from '../../../test-utils/http';
import LiveRunPage from './LiveRun.page';

vi.mock('../../../api/socket', () => ({ getSocket: () => null, joinRoom: () => () => {}, closeSocket: () => {} }));
vi.mock('@mantine/charts', () => ({ LineChart: () => null, Sparkline: () => null }));

const RUN = 'run-1';
const ENGINE = 'eng-1';
const run = buildRun({
  id: RUN,
  engineId: ENGINE,
  state: 'running',
  startedAt: '2025-06-14T10:00:00Z',
  runningSeconds: 600,
  revolutions: 750,
  openAlarms: 1,
  createdAt: '2025-06-14T09:00:00Z',
});
const engine = buildEngine({
  id: ENGINE,
  measurementPoints: [
    {
      id: 'p-mb2',
      code: 'MB2-T',
      label: 'Main bearing 2 temperature',
      kind: 'bearing_temperature',
      unit: 'degF',
      sequence: 1,
      normalLow: 70,
      normalHigh: 115,
      highLimit: 130,
      highHighLimit: 145,
    },
  ],
});
/** The run as `GET /runs/:id` answers it: with its engine's detail. */
const runAnswer = { ...run, engine };
const board: BoardPoint[] = [
  {
    pointId: 'p-mb2',
    value: 147,
    unit: 'degF',
    takenAt: '2025-06-14T10:10:00Z',
    trend: [120, 147],
    alarmState: 'active_unacknowledged',
    alarmPriority: 'high_high',
  },
];
const alarm: AlarmDto = {
  id: 'a1',
  engineId: ENGINE,
  runId: RUN,
  pointId: 'p-mb2',
  pointLabel: 'Main bearing 2 temperature',
  kind: 'high_high',
  priority: 'high_high',
  state: 'active_unacknowledged',
  conditionActive: true,
  message: 'Main bearing 2 temperature 147 °F is above its high-high limit 145 °F.',
  value: 147,
  limit: 145,
  unit: 'degF',
  raisedAt: '2025-06-14T10:10:00Z',
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
  updatedAt: '2025-06-14T10:10:00Z',
};

/** Signs in with a three-part access token, shaped like the service's. */
const signIn = (role: Role) => signInAs(role, { email: 'x@example.test' }, { accessToken: 'a.b.c' });

beforeEach(() => {
  stubFetch({
    [`GET /runs/${RUN}`]: runAnswer,
    [`GET /engines/${ENGINE}`]: engine,
    [`GET /runs/${RUN}/board`]: board,
    [`GET /runs/${RUN}/readings*`]: [],
    [`GET /runs/${RUN}/alarms`]: [alarm],
    'GET /alarms': [alarm],
    [`GET /runs/${RUN}/start-gate`]: { allowed: true, reasons: [] },
    'GET /units/conversions': { imperial: {}, metric: {} },
  });
});
afterEach(() => {
  vi.restoreAllMocks();
  signOut();
});

const page = () =>
  render(
    <Routes>
      <Route path="/runs/:id" element={<LiveRunPage />} />
    </Routes>,
    { route: `/runs/${RUN}` },
  );

describe('live run page', () => {
  it("takes its engine from the run's answer: no request of its own for the engine on a cold open", async () => {
    signIn('operator');
    const stub = stubFetch({
      [`GET /runs/${RUN}`]: runAnswer,
      [`GET /runs/${RUN}/board`]: board,
      [`GET /runs/${RUN}/readings*`]: [],
      [`GET /runs/${RUN}/alarms`]: [alarm],
      'GET /alarms': [alarm],
      [`GET /runs/${RUN}/start-gate`]: { allowed: true, reasons: [] },
      'GET /units/conversions': { imperial: {}, metric: {} },
    });
    page();
    // The tile needs the engine's measurement point (its code and label): it came with the run.
    expect(await screen.findByTestId('board-MB2-T')).toHaveTextContent('147');
    expect(stub.calls.filter((c) => c.path === `/runs/${RUN}`)).toHaveLength(1);
    expect(stub.calls.some((c) => c.path.startsWith('/engines'))).toBe(false);
  });

  it('pins a red high-high alarm banner with its point, message and an Acknowledge button for an operator', async () => {
    signIn('operator');
    page();
    const banner = await screen.findByTestId('alarm-banner');
    const row = within(banner)
      .getByText(/Main bearing 2 temperature · High-high/)
      .closest('[data-priority]')!;
    expect(row).toHaveAttribute('data-priority', 'high_high');
    expect(row.getAttribute('style')).toContain('--mantine-color-signal-7');
    expect(within(banner).getByText(/above its high-high limit 145/)).toBeInTheDocument();
    expect(within(banner).getByRole('button', { name: 'Acknowledge Main bearing 2 temperature alarm' })).toBeInTheDocument();
    expect(await screen.findByRole('link', { name: /Record round/ })).toHaveAttribute('href', `/runs/${RUN}/round`);
    // The board tile names its state in words, not by colour alone.
    expect(await screen.findByTestId('board-MB2-T')).toHaveTextContent('High-high — not acknowledged');
  });

  it("loads the indicator cards' panel when its tab is opened", async () => {
    signIn('observer');
    stubFetch({
      [`GET /runs/${RUN}`]: runAnswer,
      [`GET /engines/${ENGINE}`]: engine,
      [`GET /runs/${RUN}/board`]: board,
      [`GET /runs/${RUN}/readings*`]: [],
      [`GET /runs/${RUN}/alarms`]: [alarm],
      'GET /alarms': [alarm],
      [`GET /runs/${RUN}/start-gate`]: { allowed: true, reasons: [] },
      'GET /units/conversions': { imperial: {}, metric: {} },
      [`GET /runs/${RUN}/card-sets`]: [],
      [`GET /runs/${RUN}/brake-figures`]: [],
    });
    render(
      <Routes>
        <Route path="/runs/:id" element={<LiveRunPage />} />
      </Routes>,
      { route: `/runs/${RUN}?tab=cards` },
    );
    expect(await screen.findByTestId('card-sets-panel', {}, { timeout: 5000 })).toBeInTheDocument();
  });

  it('shows an observer everything but no write buttons', async () => {
    signIn('observer');
    page();
    const banner = await screen.findByTestId('alarm-banner');
    expect(within(banner).getByText(/above its high-high limit 145/)).toBeInTheDocument();
    expect(await screen.findByTestId('board-MB2-T')).toHaveTextContent('147');
    expect(screen.queryByRole('button', { name: /Acknowledge/ })).toBeNull();
    expect(screen.queryByRole('link', { name: /Record round/ })).toBeNull();
    expect(screen.queryByRole('tab', { name: /Import/ })).toBeNull();
    expect(screen.getByRole('button', { name: /Readings CSV/ })).toBeInTheDocument();
  });
});
