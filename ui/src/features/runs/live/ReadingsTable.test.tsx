import userEvent from '@testing-library/user-event';
import type { ReadingDto } from '@crankjournal/shared-types';
import { render, screen, within } from '../../../test-utils/render';
import type { EnginePoint } from './Board';
import { ReadingsTable } from './ReadingsTable';

const point: EnginePoint = {
  id: 'p-mb1',
  code: 'MB1-T',
  label: 'Main bearing 1',
  kind: 'bearing_temperature',
  unit: 'degF',
  sequence: 1,
  normalLow: 90,
  normalHigh: 160,
  highLimit: 180,
  highHighLimit: 200,
};

/** 150 readings a minute apart, oldest first (as the run's reading list holds them); value = its number. */
const readings: ReadingDto[] = Array.from({ length: 150 }, (_, i) => ({
  id: `r${i}`,
  clientId: `c${i}`,
  runId: 'run-1',
  pointId: point.id,
  value: 100 + i,
  originalValue: null,
  unit: 'degF',
  takenAt: new Date(Date.UTC(2026, 11, 1, 8, i)).toISOString(),
  source: 'logger',
  enteredByName: null,
  amendments: [],
}));

describe('readings table', () => {
  it('renders only the newest page of a long run, and each "older" press adds the next page', async () => {
    render(<ReadingsTable readings={readings} points={[point]} canAmend={false} onAmend={() => {}} />);
    const table = screen.getByRole('table', { name: 'Readings' });
    const rows = () => within(table).getAllByRole('row').slice(1);
    // All 150 are counted; the newest 60 are drawn, newest first.
    expect(screen.getByText('150 reading(s)')).toBeInTheDocument();
    expect(rows()).toHaveLength(60);
    expect(rows()[0]).toHaveAttribute('data-testid', 'reading-r149');
    expect(rows()[59]).toHaveAttribute('data-testid', 'reading-r90');

    await userEvent.click(screen.getByRole('button', { name: 'Show 60 older' }));
    expect(rows()).toHaveLength(120);
    expect(rows()[119]).toHaveAttribute('data-testid', 'reading-r30');

    await userEvent.click(screen.getByRole('button', { name: 'Show 30 older' }));
    expect(rows()).toHaveLength(150);
    expect(rows()[149]).toHaveAttribute('data-testid', 'reading-r0');
    expect(screen.queryByRole('button', { name: /older/ })).toBeNull();
  });
});
