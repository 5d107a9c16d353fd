import { render, screen, waitFor } from '../../../test-utils/render';
import { CALCULATORS } from '../../calculators/calculators';
import { navigationFor } from '../../../components/AppShell/navigation';
import { json, stubFetch } from '../../../test-utils/http';
import OilViscosityCalculatorPage, { VISCOSITY_EXAMPLE, toViscosityRequest } from './OilViscosityCalculator.page';
import JournalFrictionCalculatorPage, { FRICTION_EXAMPLE, toFrictionRequest } from './JournalFrictionCalculator.page';

describe('the lubrication calculators', () => {
  afterEach(() => vi.restoreAllMocks());

  it('are in the calculators registry and the navigation, with a Maintenance group after Engines for every role', () => {
    const keys = CALCULATORS.map((c) => c.key);
    expect(keys).toEqual(expect.arrayContaining(['oil-viscosity', 'journal-friction', 'lift-and-jacks']));
    const groups = navigationFor('observer').map((g) => g.label);
    expect(groups.indexOf('Maintenance')).toBe(groups.indexOf('Engines') + 1);
    expect(
      navigationFor('observer')
        .find((g) => g.label === 'Maintenance')!
        .items.map((i) => i.label),
    ).toEqual(['Due and plans', 'Bearings', 'Inspections', 'Work records', 'Lubrication']);
  });

  it('oil viscosity: sends the explicit unit fields and shows the server’s answer', async () => {
    expect(toViscosityRequest(VISCOSITY_EXAMPLE)).toEqual({
      viscosity40cSt: 150,
      viscosity100cSt: 14.5,
      temperatureC: 45,
      densityKgM3At15C: 890,
    });
    expect(toViscosityRequest({ ...VISCOSITY_EXAMPLE, temperatureC: '' })).toBeNull();
    const { spy } = stubFetch({
      '*': [],
      '/calculations/oil-viscosity': {
        kinematicCst: 114.39,
        densityKgM3: 872.6,
        densityAssumed: false,
        dynamicPaS: 0.0998,
        dynamicReyn: 0.00001448,
        method: 'ASTM D341',
      },
    });
    render(<OilViscosityCalculatorPage />);
    await waitFor(() => expect(screen.getByTestId('visc-cst')).toHaveTextContent('114.4'));
    expect(screen.getByTestId('visc-reyn')).toHaveTextContent('1.45e-5');
    const call = spy.mock.calls.find(([u]) => String(u) === '/api/calculations/oil-viscosity')!;
    expect(JSON.parse(String((call[1] as RequestInit).body))).toEqual(toViscosityRequest(VISCOSITY_EXAMPLE));
  });

  it('journal friction: sends diameterIn … loadLbf and shows the server’s message naming the field', async () => {
    expect(toFrictionRequest(FRICTION_EXAMPLE)).toEqual({
      diameterIn: 16,
      lengthIn: 26,
      radialClearanceIn: 0.008,
      speedRpm: 75,
      viscosityReyn: 0.0000145,
      loadLbf: 112500,
    });
    stubFetch({ '*': () => json({ statusCode: 400, error: 'Bad Request', message: ['radialClearanceIn must be at least 0.00001'] }, 400) });
    render(<JournalFrictionCalculatorPage />);
    await waitFor(() => expect(screen.getByTestId('calc-error')).toHaveTextContent('radialClearanceIn must be at least 0.00001'));
  });
});
