import userEvent from '@testing-library/user-event';
import type { ChecklistEntryDto, ChecklistItemDef } from '@crankjournal/shared-types';
import { render, screen } from '../../../test-utils/render';
import { ItemCard, valueWords, type ItemCardProps } from './ItemCard';

const reading: ChecklistItemDef = {
  key: 'line-pressure',
  kind: 'reading',
  label: 'Pre-lube line pressure',
  required: true,
  unit: 'psig',
  min: 15,
  max: 30,
  caution: { hazard: 'pressure', text: 'Lines under pressure while the pump runs.' },
};
const tick: ChecklistItemDef = { key: 'valves', kind: 'tick', label: 'Line valves open', required: true };

const entry = (p: Partial<ChecklistEntryDto> = {}): ChecklistEntryDto => ({
  itemKey: 'line-pressure',
  tick: null,
  value: null,
  choice: null,
  text: null,
  hasPhoto: false,
  done: false,
  outOfRange: false,
  override: null,
  filledByName: null,
  filledAt: null,
  original: null,
  amendments: [],
  ...p,
});

const props = (p: Partial<ItemCardProps>): ItemCardProps => ({
  checklistId: 'c1',
  item: reading,
  entry: entry(),
  mode: 'fill',
  busy: false,
  canOverride: false,
  canAmend: false,
  onFill: vi.fn(),
  onPhoto: vi.fn(),
  onOverride: vi.fn(),
  onAmend: vi.fn(),
  ...p,
});

describe('ItemCard', () => {
  it('shows the acceptance range and the caution beside the item', () => {
    render(<ItemCard {...props({})} />);
    expect(screen.getByText(/Acceptance range:/)).toHaveTextContent('Acceptance range: 15 to 30 psig');
    expect(screen.getByRole('note')).toHaveTextContent('Caution — Pressure');
    expect(screen.getByRole('note')).toHaveTextContent('Lines under pressure while the pump runs.');
  });

  it('flags an out-of-range reading as blocking the signature, and offers the chief engineer an override', async () => {
    const user = userEvent.setup();
    const onOverride = vi.fn();
    render(<ItemCard {...props({ entry: entry({ value: 12, done: true, outOfRange: true }), canOverride: true, onOverride })} />);
    expect(screen.getByText(/signing is blocked/)).toBeInTheDocument();
    expect(screen.getByTestId('item-line-pressure')).toHaveStyle({ borderWidth: '2px' });
    await user.click(screen.getByRole('button', { name: 'Record override' }));
    expect(onOverride).toHaveBeenCalled();
  });

  it('offers no override to an operator', () => {
    render(<ItemCard {...props({ entry: entry({ value: 12, done: true, outOfRange: true }), canOverride: false })} />);
    expect(screen.queryByRole('button', { name: 'Record override' })).toBeNull();
  });

  it('shows a recorded override with who and why instead of the block', () => {
    render(
      <ItemCard
        {...props({
          entry: entry({
            value: 12,
            done: true,
            outOfRange: true,
            override: { reason: 'Gauge reads low.', byName: 'H. Chief', at: '2026-12-05T09:00:00Z' },
          }),
        })}
      />,
    );
    expect(screen.queryByText(/signing is blocked/)).toBeNull();
    expect(screen.getByTestId('override-line-pressure')).toHaveTextContent('accepted by H. Chief');
    expect(screen.getByTestId('override-line-pressure')).toHaveTextContent('Gauge reads low.');
  });

  it('saves a reading when the field is left, as a number', async () => {
    const user = userEvent.setup();
    const onFill = vi.fn();
    render(<ItemCard {...props({ onFill })} />);
    const input = screen.getByTestId('reading-line-pressure');
    await user.clear(input);
    await user.type(input, '22');
    await user.tab();
    expect(onFill).toHaveBeenCalledWith({ value: 22 });
  });

  it('toggles a tick with one big button', async () => {
    const user = userEvent.setup();
    const onFill = vi.fn();
    render(<ItemCard {...props({ item: tick, entry: entry({ itemKey: 'valves' }), onFill })} />);
    await user.click(screen.getByRole('button', { name: 'Mark done' }));
    expect(onFill).toHaveBeenCalledWith({ tick: true });
  });

  it('shows a signed, amended value with the original struck through and the amendment', () => {
    render(
      <ItemCard
        {...props({
          mode: 'signed',
          canAmend: true,
          entry: entry({
            value: 24,
            done: true,
            original: { value: 22 },
            amendments: [
              {
                id: 'a1',
                itemKey: 'line-pressure',
                oldValue: { value: 22 },
                newValue: { value: 24 },
                reason: 'Misread the gauge.',
                overrideReason: null,
                byName: 'T. Operator',
                at: '2026-12-05T10:00:00Z',
              },
            ],
          }),
        })}
      />,
    );
    expect(screen.getByLabelText('as signed: 22 psig')).toHaveClass('cj-struck');
    expect(screen.getByText('24 psig')).toBeInTheDocument();
    expect(screen.getByText(/Amended 22 psig → 24 psig by T. Operator/)).toHaveTextContent('Misread the gauge.');
    expect(screen.getByRole('button', { name: 'Amend' })).toBeInTheDocument();
  });

  it('words values by kind', () => {
    expect(valueWords(tick, { tick: true })).toBe('Done');
    expect(valueWords(reading, { value: 22 })).toBe('22 psig');
    expect(valueWords({ ...reading, unit: 'degF' }, { value: 68 })).toBe('68 °F');
  });
});
