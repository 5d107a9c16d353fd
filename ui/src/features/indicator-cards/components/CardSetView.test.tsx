import userEvent from '@testing-library/user-event';
import type { CardSetDto } from '@crankjournal/shared-types';
import { render, screen, within } from '../../../test-utils/render';
import { upsertSet } from '../api/indicator-cards.api';
import { CardSetView } from './CardSetView';

// A stored set as the API returns it (figures invented for the display; the server computes them).
function set(over: Partial<CardSetDto> = {}): CardSetDto {
  const ideal = {
    admissionPressurePsia: 146,
    backPressurePsia: 42,
    cutOffFraction: 0.35,
    clearanceFraction: 0.08,
    meanEffectivePressurePsi: 63.6,
    meanEffectivePressureWithClearancePsi: 66.1,
    outline: [
      { strokeFraction: 0, pressurePsig: 131 },
      { strokeFraction: 1, pressurePsig: 27 },
      { strokeFraction: 0, pressurePsig: 27 },
    ],
  };
  return {
    id: 'set-1',
    runId: 'run-1',
    engineId: 'eng-1',
    takenAt: '2026-09-12T11:45:00Z',
    speedRpm: 73.7,
    speedSource: 'reading',
    speedReadingAt: '2026-09-12T11:45:00Z',
    cutOffPercent: 34,
    throttlePressurePsig: 134.1,
    throttleSource: 'reading',
    receiverPressurePsig: 26.9,
    receiverSource: 'reading',
    vacuumInHg: 24.9,
    vacuumSource: 'reading',
    barometerInHg: null,
    barometerSource: null,
    notes: null,
    cylinders: [
      { cylinderId: 'hp', label: 'HP', role: 'high', boreIn: 24, strokeIn: 48, pistonRodIn: 5.5, tailRodIn: 0, clearancePercent: 8 },
    ],
    cards: [
      {
        id: 'card-1',
        cardSetId: 'set-1',
        cylinderId: 'hp',
        cylinderLabel: 'HP',
        end: 'head',
        method: 'planimeter',
        springPsiPerIn: 80,
        lengthIn: 3.5,
        areaSqIn: 2.41,
        ordinatesIn: null,
        givenMeanEffectivePressurePsi: null,
        imageId: null,
        trace: null,
        traceOrigin: null,
        cutOffPercent: null,
        compressionPercent: null,
        admissionPressurePsig: null,
        note: null,
        meanHeightIn: 0.689,
        meanEffectivePressurePsi: 55.1,
        tracedAreaSqIn: 2.41,
        outline: null,
        createdBy: 'u1',
        createdByName: 'Tobias Wrenfield',
        createdAt: '2026-09-12T11:55:00Z',
        amendments: [
          {
            id: 'a1',
            reason: 'Planimeter run again.',
            by: 'u2',
            byName: 'Hester Quarmby',
            at: '2026-09-12T12:30:00Z',
            changes: [{ field: 'areaSqIn', from: 2.5, to: 2.41 }],
          },
        ],
      },
    ],
    results: {
      speedRpm: 73.7,
      complete: false,
      missingEnds: [{ cylinderId: 'hp', cylinderLabel: 'HP', end: 'crank' }],
      cylinders: [
        {
          cylinderId: 'hp',
          label: 'HP',
          role: 'high',
          indicatedHorsepower: 223,
          indicatedKilowatts: 166.3,
          workShare: null,
          admissionPressurePsia: 148.8,
          backPressurePsia: 41.6,
          ends: [
            {
              end: 'head',
              cardId: 'card-1',
              meanEffectivePressurePsi: 55.1,
              effectiveAreaSqIn: 452.4,
              indicatedHorsepower: 223,
              ideal,
              idealMissing: null,
              diagramFactor: 0.866,
              steam: null,
            },
          ],
        },
      ],
      totalIndicatedHorsepower: 223,
      totalIndicatedKilowatts: 166.3,
      referredMeanEffectivePressurePsi: null,
      referredToCylinderLabel: null,
      referredMeanEffectivePressureMissing: 'needs a card from every end; missing: HP crank end',
      workSharesMissing: 'needs a card from every end; missing: HP crank end',
      receiverPressurePsig: 26.9,
      lowPressureAdmissionPsig: null,
      receiverDropPsi: null,
      brake: null,
      steamAccountedForLbPerIhpHour: null,
      atmosphericPressurePsia: 14.696,
      atmosphereBasis: 'standard',
      notes: ['Not yet taken: HP crank end.'],
      computedAt: '2026-09-12T12:30:00Z',
    },
    createdBy: 'u1',
    createdByName: 'Tobias Wrenfield',
    createdAt: '2026-09-12T11:55:00Z',
    amendments: [],
    ...over,
  };
}

describe('CardSetView', () => {
  it('marks an incomplete set: total = sum of the cards present, the missing end named, referred MEP absent with its reason', () => {
    render(<CardSetView set={set()} canWrite={false} defaultOpen={false} />);
    expect(screen.getByTestId('card-set-total-basis')).toHaveTextContent('Sum of the cards present');
    expect(screen.getByTestId('card-set-incomplete')).toHaveTextContent("Incomplete set, not the engine's power. Missing: HP crank end.");
    expect(screen.getByTestId('stat-referred')).toHaveTextContent('Not shown: needs a card from every end; missing: HP crank end');
    expect(screen.getByTestId('stat-vacuum')).toHaveTextContent('no barometer: against the standard atmosphere, 29.92 inHg');
  });

  it('shows the total, the summary table, the card over its ideal card and the amendment with the old value struck through', () => {
    render(<CardSetView set={set()} canWrite={false} defaultOpen />);
    expect(screen.getByTestId('card-set-total')).toHaveTextContent('223 ihp');
    expect(screen.getByText('1 of 2 cards')).toBeInTheDocument();
    const table = screen.getByRole('table', { name: 'Card set summary' });
    expect(within(table).getByRole('row', { name: /HP head end/ })).toHaveTextContent('55.1');
    expect(within(table).getByRole('row', { name: /HP head end/ })).toHaveTextContent('0.87');
    expect(screen.getByTestId('pv-ideal')).toBeInTheDocument();
    const amended = screen.getByTestId('card-amendments');
    expect(within(amended).getByTestId('amended-from')).toHaveClass('cj-struck');
    expect(within(amended).getByTestId('amended-from')).toHaveTextContent('2.50 in²');
    expect(amended).toHaveTextContent('Hester Quarmby');
    expect(amended).toHaveTextContent('Planimeter run again.');
  });

  it('observers get no amend or add buttons; the crew do', () => {
    const { unmount } = render(<CardSetView set={set()} canWrite={false} defaultOpen />);
    expect(screen.queryByRole('button', { name: 'Amend' })).toBeNull();
    expect(screen.queryByRole('button', { name: /Add the HP crank end card/ })).toBeNull();
    unmount();
    render(<CardSetView set={set()} canWrite defaultOpen />);
    expect(screen.getByRole('button', { name: 'Amend' })).toBeInTheDocument();
    expect(screen.getByRole('button', { name: /Add the HP crank end card/ })).toBeInTheDocument();
  });

  it('folds away the cards of older sets until asked', async () => {
    const user = userEvent.setup();
    render(<CardSetView set={set()} canWrite={false} defaultOpen={false} />);
    await user.click(screen.getByRole('button', { name: 'Show the cards and the summary' }));
    expect(screen.getByRole('button', { name: 'Hide the cards' })).toBeInTheDocument();
  });
});

describe('a live set arriving', () => {
  it('is added in time order, or replaces the one it amends', () => {
    const a = set({ id: 'a', takenAt: '2026-09-12T11:00:00Z' });
    const b = set({ id: 'b', takenAt: '2026-09-12T12:00:00Z' });
    const c = set({ id: 'c', takenAt: '2026-09-12T11:30:00Z' });
    expect(upsertSet([a, b], c)!.map((s) => s.id)).toEqual(['a', 'c', 'b']);
    const amended = { ...a, speedRpm: 75 };
    const next = upsertSet([a, b], amended)!;
    expect(next).toHaveLength(2);
    expect(next[0].speedRpm).toBe(75);
    expect(upsertSet(undefined, a)).toBeUndefined();
  });
});
