import userEvent from '@testing-library/user-event';
import { render, screen, within } from '../../../test-utils/render';
import { calc, overloaded, rect } from '../../../test-utils/fixtures/mill';
import { PassCalcTable, type PassRow } from './PassCalcTable';

const row = (key: string, c = calc()): PassRow => ({
  key,
  passNumber: 1,
  standName: 'Stand 1',
  entry: rect(76.2, 76.2),
  exit: rect(62, 80),
  temperatureC: 1150,
  temperatureWord: 'expected',
  calc: c,
});

// Rendering Mantine in jsdom is slow on a busy machine.
vi.setConfig({ testTimeout: 30_000 });

describe('PassCalcTable', () => {
  it('a normal pass shows its figures, no warning, and the flow stress flagged as extrapolated', () => {
    render(<PassCalcTable caption="Passes" rows={[row('a')]} />);
    const tr = screen.getByTestId('pass-row-a');
    expect(tr).toHaveAttribute('data-flagged', 'false');
    expect(within(tr).getByText('none')).toBeInTheDocument();
    expect(within(tr).getByTestId('flow-stress-extrapolated')).toHaveTextContent('extrapolated');
    expect(within(tr).getByText(/372 kN/)).toBeInTheDocument();
    expect(screen.queryByRole('alert')).not.toBeInTheDocument();
  });

  it('an overloaded pass is marked and its warnings are spelt out beside it', () => {
    render(<PassCalcTable caption="Passes" rows={[row('b', overloaded())]} />);
    expect(screen.getByTestId('pass-row-b')).toHaveAttribute('data-flagged', 'true');
    expect(screen.getAllByTestId('pass-warning-stand_force')[0]).toHaveTextContent('Stand overloaded');
    const alerts = screen.getAllByRole('alert');
    expect(alerts.map((a) => a.textContent).join(' ')).toMatch(/below 67.5 rpm/);
    expect(alerts.map((a) => a.textContent).join(' ')).toMatch(/over the stand's maximum of 900 kN/);
  });

  it('shows the working, with the sources and the cited model, on demand', async () => {
    const user = userEvent.setup();
    render(<PassCalcTable caption="Passes" rows={[row('c')]} />);
    expect(screen.queryByText(/Misaka & Yoshimoto \(1967\), test citation/)).not.toBeInTheDocument();
    await user.click(screen.getByRole('button', { name: 'Show the working of pass 1' }));
    expect(screen.getByText(/Misaka & Yoshimoto \(1967\), test citation/)).toBeInTheDocument();
    expect(screen.getByText(/Indicated power: site setting/)).toBeInTheDocument();
  });

  it('a pass that cannot be calculated says why', () => {
    render(<PassCalcTable caption="Passes" rows={[{ ...row('d'), calc: null, calcError: 'Test mill has no stand 4.' }]} />);
    expect(screen.getByText('Test mill has no stand 4.')).toBeInTheDocument();
    expect(screen.getByTestId('pass-row-d')).toHaveAttribute('data-flagged', 'true');
  });
});
