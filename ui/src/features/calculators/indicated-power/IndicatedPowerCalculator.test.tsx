import { render, screen, waitFor } from '../../../test-utils/render';
import { json, stubFetch } from '../../../test-utils/http';
import IndicatedPowerCalculatorPage, { EXAMPLE, toCalculatorRequest } from './IndicatedPowerCalculator.page';

describe('the indicated power calculator', () => {
  afterEach(() => vi.restoreAllMocks());

  it('sends the example as the API body: planimeter and mid-ordinate HP cards, an LP card by MEP, no LP crank card', () => {
    expect(toCalculatorRequest(EXAMPLE)).toEqual({
      rpm: 40,
      strokeIn: 66,
      cylinders: [
        {
          label: 'HP',
          boreIn: 22.57,
          pistonRodIn: 4,
          tailRodIn: 0,
          cards: [
            { end: 'head', areaSqIn: 2.6, lengthIn: 3.6, springPsiPerIn: 60 },
            { end: 'crank', ordinatesIn: [0.9, 0.85, 0.8, 0.74, 0.69, 0.63, 0.55, 0.46, 0.35, 0.2], springPsiPerIn: 60 },
          ],
        },
        { label: 'LP', boreIn: 44, pistonRodIn: 4, tailRodIn: 4, cards: [{ end: 'head', meanEffectivePressurePsi: 12.4 }] },
      ],
    });
  });

  it('shows the server’s answer: total, kW, referred MEP and each end', async () => {
    const { spy: fetchSpy } = stubFetch({
      'POST /calculations/indicated-power': {
        cylinders: [
          {
            label: 'HP',
            indicatedHorsepower: 211.2,
            ends: [{ end: 'head', meanEffectivePressurePsi: 43.33, effectiveAreaSqIn: 400.09, indicatedHorsepower: 115.6 }],
          },
        ],
        complete: true,
        missingEnds: [],
        totalIndicatedHorsepower: 335.9,
        totalIndicatedKilowatts: 250.5,
        referredMeanEffectivePressurePsi: 16.71,
        referredMeanEffectivePressureMissing: null,
      },
    });
    render(<IndicatedPowerCalculatorPage />);
    await waitFor(() => expect(screen.getByTestId('calc-total')).toHaveTextContent('335.9 ihp'));
    const [url, init] = fetchSpy.mock.calls[0]!;
    expect(String(url)).toBe('/api/calculations/indicated-power');
    expect(JSON.parse(String((init as RequestInit).body))).toEqual(toCalculatorRequest(EXAMPLE));
    expect(screen.getByRole('row', { name: /HP head end/ })).toHaveTextContent('43.33');
    expect(screen.getByText(/referred MEP 16.71 psi/)).toBeInTheDocument();
    expect(screen.queryByTestId('calc-incomplete')).not.toBeInTheDocument();
  });

  it('marks the example’s answer as incomplete: the LP crank end named, the total the cards present, no referred MEP', async () => {
    stubFetch({
      'POST /calculations/indicated-power': {
        cylinders: [
          {
            label: 'HP',
            indicatedHorsepower: 211.2,
            ends: [{ end: 'head', meanEffectivePressurePsi: 43.33, effectiveAreaSqIn: 400.09, indicatedHorsepower: 115.6 }],
          },
        ],
        complete: false,
        missingEnds: [{ cylinderLabel: 'LP', end: 'crank' }],
        totalIndicatedHorsepower: 335.9,
        totalIndicatedKilowatts: 250.5,
        referredMeanEffectivePressurePsi: null,
        referredMeanEffectivePressureMissing: 'needs a card from every end; missing: LP crank end',
      },
    });
    render(<IndicatedPowerCalculatorPage />);
    await waitFor(() => expect(screen.getByTestId('calc-incomplete')).toHaveTextContent('No card for: LP crank end.'));
    expect(screen.getByTestId('calc-total-basis')).toHaveTextContent('Sum of the cards present');
    expect(screen.getByTestId('calc-referred-missing')).toHaveTextContent(
      'No referred MEP: needs a card from every end; missing: LP crank end',
    );
    expect(screen.queryByText(/referred MEP 16/)).not.toBeInTheDocument();
  });

  it('shows the server’s message naming the field when it refuses', async () => {
    stubFetch({
      'POST /calculations/indicated-power': () =>
        json({ statusCode: 400, error: 'Bad Request', message: ['cylinders[0].pistonRodIn: must be smaller than the bore'] }, 400),
    });
    render(<IndicatedPowerCalculatorPage />);
    await waitFor(() =>
      expect(screen.getByTestId('calc-error')).toHaveTextContent('cylinders[0].pistonRodIn: must be smaller than the bore'),
    );
  });
});
