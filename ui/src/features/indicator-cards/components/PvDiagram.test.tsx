import { render, screen } from '../../../test-utils/render';
import { PvDiagram, niceTicks } from './PvDiagram';

const card = [
  { strokeFraction: 0, pressurePsig: 110 },
  { strokeFraction: 0.35, pressurePsig: 100 },
  { strokeFraction: 1, pressurePsig: 40 },
  { strokeFraction: 1, pressurePsig: 28 },
  { strokeFraction: 0, pressurePsig: 30 },
];
const ideal = [
  { strokeFraction: 0, pressurePsig: 120 },
  { strokeFraction: 0.35, pressurePsig: 120 },
  { strokeFraction: 1, pressurePsig: 42 },
  { strokeFraction: 1, pressurePsig: 27 },
  { strokeFraction: 0, pressurePsig: 27 },
  { strokeFraction: 0, pressurePsig: 120 },
];

describe('PvDiagram', () => {
  it('draws the card solid over the ideal card, which is dashed, with the atmospheric line', () => {
    render(<PvDiagram outline={card} ideal={ideal} label="HP head end" />);
    expect(screen.getByRole('img', { name: 'HP head end' })).toBeInTheDocument();
    const idealShape = screen.getByTestId('pv-ideal');
    expect(idealShape).toHaveAttribute('stroke-dasharray');
    expect(idealShape.getAttribute('points')!.split(' ')).toHaveLength(ideal.length);
    expect(screen.getByTestId('pv-card').getAttribute('points')!.split(' ')).toHaveLength(card.length);
    expect(screen.getByTestId('pv-card')).not.toHaveAttribute('stroke-dasharray');
    expect(screen.getByTestId('pv-atmospheric')).toBeInTheDocument();
  });

  it('the higher pressure is drawn higher up (smaller y on screen)', () => {
    render(<PvDiagram outline={card} ideal={null} label="x" />);
    const ys = screen
      .getByTestId('pv-card')
      .getAttribute('points')!
      .split(' ')
      .map((p) => Number(p.split(',')[1]));
    expect(ys[0]).toBeLessThan(ys[2]); // 110 psig above 40 psig
  });

  it('says so when there is nothing to draw', () => {
    render(<PvDiagram outline={null} ideal={null} label="x" />);
    expect(screen.getByTestId('pv-empty')).toBeInTheDocument();
  });

  it('pressure ticks are round numbers covering the range', () => {
    expect(niceTicks(-12, 28)).toEqual([-10, 0, 10, 20]);
    expect(niceTicks(0, 130)).toEqual([0, 50, 100]);
  });
});
