import { render, screen, waitFor } from '../../../test-utils/render';
import { overloaded } from '../../../test-utils/fixtures/mill';
import { stubFetch } from '../../../test-utils/http';
import RollingPassCalculatorPage, { EXAMPLE, toRollingPassRequest } from './RollingPassCalculator.page';

// Rendering Mantine in jsdom is slow on a busy machine.
vi.setConfig({ testTimeout: 30_000 });

describe('rolling pass calculator', () => {
  afterEach(() => vi.restoreAllMocks());

  it('sends a flat body with units in the names, sections split into thickness and width', () => {
    const body = toRollingPassRequest(EXAMPLE);
    expect(body).toMatchObject({
      rollDiameterMm: 406.4,
      entryThicknessMm: 76.2,
      entryWidthMm: 76.2,
      exitThicknessMm: 62,
      exitWidthMm: 80,
      temperatureC: 1150,
      carbonPct: 0.2,
      rollSpeedRpm: 75,
      standMaxForceKn: 900,
      flywheelMassLb: 156800,
      flywheelRadiusOfGyrationFt: 9.9,
      barExitLengthM: 2.1,
      indicatedHp: 650,
      frictionCoefficient: 0.3,
    });
  });

  it('leaves the flywheel group out when it is not checked, and a round exit sends its diameter twice', () => {
    const body = toRollingPassRequest({ ...EXAMPLE, flywheel: false, exit: { shape: 'round', heightMm: 60, widthMm: '' } });
    expect(body.flywheelMassLb).toBeUndefined();
    expect(body.indicatedHp).toBeUndefined();
    expect(body).toMatchObject({ exitShape: 'round', exitThicknessMm: 60, exitWidthMm: 60 });
  });

  it('shows the server’s figures and its warnings', async () => {
    const { spy: fetchSpy } = stubFetch({
      '*': [],
      '/calculations/rolling-pass': { ...overloaded(), caution: 'Test caution from the server.' },
    });
    render(<RollingPassCalculatorPage />);
    const result = await screen.findByTestId('rolling-pass-result', {}, { timeout: 10000 });
    expect(result).toHaveTextContent('2,347 kN');
    expect(result).toHaveTextContent('61.9 rpm');
    expect(
      screen
        .getAllByRole('alert')
        .map((a) => a.textContent)
        .join(' '),
    ).toMatch(/Flywheel speed drop/);
    expect(screen.getByText('Test caution from the server.')).toBeInTheDocument();
    // Which model each figure used, and the bite limit with its friction coefficient.
    const models = screen.getByTestId('rolling-pass-models');
    expect(models).toHaveTextContent('Roll force: L·w·σ̄ × friction factor 1.2, simple slab estimate');
    expect(models).toHaveTextContent('Bite: Δh ≤ μ²·R with μ = 0.3 — largest draft 18.3 mm');
    await waitFor(() => expect(fetchSpy.mock.calls.some(([u]) => String(u).endsWith('/calculations/rolling-pass'))).toBe(true));
  });
});
