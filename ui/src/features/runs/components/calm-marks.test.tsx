import { render, screen } from '../../../test-utils/render';
import { Caution, hazardOf } from '../../../components/Caution/Caution';
import { OpenAlarmsBadge, RunStateBadge } from './RunStateBadge';

// Calm when normal (common practice, no source): normal states are neutral outlines, fills are for the abnormal.
describe('calm marks', () => {
  it('shows a running run as a neutral outline, not a fill', () => {
    render(<RunStateBadge state="running" />);
    const badge = screen.getByText('Running').closest('.mantine-Badge-root')!;
    expect(badge).toHaveAttribute('data-variant', 'outline');
  });

  it('gives an abandoned run its own dashed mark, not the struck-through mark of an amended value', () => {
    render(<RunStateBadge state="abandoned" />);
    const badge = screen.getByText('Abandoned').closest('.mantine-Badge-root')!;
    expect(badge).toHaveClass('cj-abandoned');
    expect(badge.innerHTML).not.toContain('line-through');
  });

  it('fills open alarms on the run itself and outlines them in amber in planning lists', () => {
    render(
      <>
        <OpenAlarmsBadge count={2} />
        <OpenAlarmsBadge count={3} planning />
      </>,
    );
    expect(screen.getByText('2 open alarms').closest('.mantine-Badge-root')).toHaveAttribute('data-variant', 'filled');
    expect(screen.getByText('3 open alarms').closest('.mantine-Badge-root')).toHaveAttribute('data-variant', 'outline');
  });

  it('puts a caution in a neutral panel with the hazard named by its title', () => {
    render(<Caution title="Caution — Pressure">Lines under pressure.</Caution>);
    const note = screen.getByRole('note');
    expect(note).toHaveClass('cj-caution');
    expect(note).toHaveAttribute('data-hazard', 'pressure');
    expect(hazardOf('Hot surfaces')).toBe('heat');
    expect(hazardOf('Keep clear of the flywheel')).toBe('moving');
    expect(hazardOf('Caution')).toBe('general');
  });
});
