import { render, screen } from '../../../test-utils/render';
import { Board, type EnginePoint } from './Board';
import { glassScale, limitMark } from './GaugeGlass';

const bearing: EnginePoint = {
  id: 'p1',
  code: 'MB1-T',
  label: 'Main bearing 1',
  kind: 'bearing_temperature',
  unit: 'degF',
  sequence: 1,
  normalLow: 80,
  normalHigh: 120,
  highLimit: 130,
  highHighLimit: 150,
};

// Limits compare with >= at the limit, as the alarm rules do (common practice, no source).
describe('limit marks and the gauge glass', () => {
  it('places a value against the limits', () => {
    expect(limitMark(143, bearing)).toBe('high');
    expect(limitMark(150, bearing)).toBe('high_high');
    expect(limitMark(129.9, bearing)).toBeNull();
    expect(limitMark(40, { ...bearing, lowLimit: 50 })).toBe('low');
    expect(limitMark(null, bearing)).toBeNull();
  });

  it('scales the strip to every limit and the value', () => {
    const s = glassScale(143, bearing)!;
    expect(s.min).toBeLessThan(80);
    expect(s.max).toBeGreaterThan(150);
    expect(glassScale(5, {})).toBeNull();
  });

  it('marks 143 °F against a 130 °F high limit on a board with no open alarm (a closed run)', () => {
    render(
      <Board
        points={[bearing]}
        board={[{ pointId: 'p1', value: 143, unit: 'degF', takenAt: null, trend: [], alarmState: null, alarmPriority: null }]}
      />,
    );
    expect(screen.getByTestId('board-MB1-T')).toHaveAttribute('data-limit', 'high');
    expect(screen.getByTestId('limit-mark-MB1-T')).toHaveTextContent('Above high limit');
    expect(screen.getAllByTestId('gauge-limit')).toHaveLength(2);
    expect(screen.getByTestId('gauge-pointer')).toBeInTheDocument();
  });
});
