import userEvent from '@testing-library/user-event';
import { render, screen, waitFor } from '../../../test-utils/render';
import { bar, calc, overloaded, rect, schedule } from '../../../test-utils/fixtures/mill';
import { json, signIn, signOut, stubFetch } from '../../../test-utils/http';
import { LogPass } from './LogPass';
import { nextBarCode } from './StartBar';

const stands = [
  { id: 's1', position: 1, name: 'Stand 1', rollDiameterMm: 406.4, barrelLengthMm: 762, rollSpeedRatio: 1, maxSeparatingForceKn: 900 },
  { id: 's2', position: 2, name: 'Stand 2', rollDiameterMm: 406.4, barrelLengthMm: 762, rollSpeedRatio: 1, maxSeparatingForceKn: 800 },
];
const logged = (c = calc()) => ({
  id: 'lp',
  barId: 'bar-1',
  barCode: 'B-01',
  runId: 'run-1',
  passNumber: 2,
  standPosition: 2,
  standName: 'Stand 2',
  at: '2026-12-01T10:01:00Z',
  measuredTemperatureC: 1100,
  entry: rect(80, 62),
  exit: rect(60, 66),
  plannedExit: rect(60, 66),
  notes: '',
  loggedByName: 'Test',
  calc: c,
});

// Rendering Mantine in jsdom is slow on a busy machine.
vi.setConfig({ testTimeout: 30_000 });

describe('LogPass', () => {
  beforeEach(() => signIn('mill_lead'));
  afterEach(() => {
    vi.restoreAllMocks();
    signOut();
  });

  it('prefills the next pass from the bar’s schedule and sends the measured figures', async () => {
    const user = userEvent.setup();
    const { spy: fetchSpy } = stubFetch({ '*': () => json(logged(), 201), '/mill/schedules/*': schedule() });
    const b = bar({ passes: [{ ...logged(), id: 'lp1', passNumber: 1, standPosition: 1, entry: rect(76.2, 76.2), exit: rect(62, 80) }] });
    render(<LogPass runId="run-1" bars={[b]} stands={stands} barId="bar-1" onBarChange={() => {}} />);
    await waitFor(() => expect(screen.getByLabelText('Measured temperature, °C')).toHaveValue('1110'), { timeout: 8000 });
    expect(screen.getByLabelText('Pass number')).toHaveValue('2');
    expect(screen.getByLabelText('Entry: height, mm')).toHaveValue('80');
    expect(screen.getByLabelText('Measured exit: height, mm')).toHaveValue('60');
    await user.clear(screen.getByLabelText('Measured temperature, °C'));
    await user.type(screen.getByLabelText('Measured temperature, °C'), '1096');
    await user.clear(screen.getByLabelText('Measured exit: width, mm'));
    await user.type(screen.getByLabelText('Measured exit: width, mm'), '66.5');
    await user.click(screen.getByRole('button', { name: 'Log pass' }));
    await waitFor(() => expect(fetchSpy.mock.calls.some(([u]) => String(u).endsWith('/mill/bars/bar-1/passes'))).toBe(true));
    const [, init] = fetchSpy.mock.calls.find(([u]) => String(u).endsWith('/mill/bars/bar-1/passes'))!;
    const body = JSON.parse(String(init?.body));
    expect(body).toMatchObject({ passNumber: 2, standPosition: 2, measuredTemperatureC: 1096, entry: rect(80, 62), exit: rect(60, 66.5) });
    expect(body.clientId).toMatch(/^[0-9a-f-]{36}$/);
  });

  it('shows the warnings of an overloaded pass as soon as it is logged', async () => {
    const user = userEvent.setup();
    stubFetch({ '*': () => json(logged(overloaded()), 201), '/mill/schedules/*': schedule() });
    render(<LogPass runId="run-1" bars={[bar()]} stands={stands} barId="bar-1" onBarChange={() => {}} />);
    await waitFor(() => expect(screen.getByLabelText('Measured temperature, °C')).toHaveValue('1150'), { timeout: 8000 });
    await user.click(screen.getByRole('button', { name: 'Log pass' }));
    const result = await screen.findByTestId('last-pass-result');
    expect(result).toHaveTextContent('Flywheel speed drop');
    expect(result).toHaveTextContent('below 67.5 rpm');
    expect(result).toHaveTextContent('Stand overloaded');
  });
});

describe('nextBarCode', () => {
  it('counts on from the last bar, keeping its prefix and width', () => {
    expect(nextBarCode([])).toBe('B-01');
    expect(nextBarCode([bar({ barCode: 'F-09' })])).toBe('F-10');
    expect(nextBarCode([bar({ barCode: 'R-099' })])).toBe('R-100');
    expect(nextBarCode([bar({ barCode: 'odd' })])).toBe('B-02');
  });
});
