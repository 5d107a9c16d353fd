import userEvent from '@testing-library/user-event';
import type { Role } from '@crankjournal/shared-types';
import { render, screen, waitFor, within } from '../../../test-utils/render';
import { lot } from '../../../test-utils/fixtures/mill';
import { json, signIn, signOut, stubFetch } from '../../../test-utils/http';
import { LotStatusActions } from './LotStatusActions';

// Rendering Mantine in jsdom is slow on a busy machine.
vi.setConfig({ testTimeout: 30_000 });

describe('LotStatusActions', () => {
  afterEach(() => {
    vi.restoreAllMocks();
    signOut();
  });

  it.each([
    ['mill_lead', true],
    ['chief_engineer', true],
    ['observer', false],
    ['operator', false],
    ['administrator', false],
  ] as [Role, boolean][])('a %s sees the next step: %s', (role, shown) => {
    signIn(role);
    render(<LotStatusActions lot={lot()} />);
    expect(!!screen.queryByRole('button', { name: 'Mark ordered' })).toBe(shown);
  });

  it('a dispatched lot has no next step', () => {
    signIn('mill_lead');
    render(<LotStatusActions lot={lot({ status: 'dispatched', nextStatus: null })} />);
    expect(screen.queryByRole('button')).not.toBeInTheDocument();
  });

  it('moves the lot one step with the note', async () => {
    const user = userEvent.setup();
    signIn('mill_lead');
    const { spy: fetchSpy } = stubFetch({ '*': lot({ status: 'ordered', nextStatus: 'on_roll_plan' }) });
    render(<LotStatusActions lot={lot()} />);
    await user.click(screen.getByRole('button', { name: 'Mark ordered' }));
    const dialog = await screen.findByRole('dialog');
    await user.clear(screen.getByLabelText('Note (optional)'));
    await user.type(screen.getByLabelText('Note (optional)'), 'Accepted by telephone');
    await user.click(dialog.querySelectorAll('button')[dialog.querySelectorAll('button').length - 1]);
    await waitFor(() => expect(fetchSpy).toHaveBeenCalled(), { timeout: 5000 });
    const [url, init] = fetchSpy.mock.calls[0]!;
    expect(String(url)).toBe('/api/mill/lots/lot-1/transitions');
    expect(JSON.parse(String(init?.body))).toEqual({ to: 'ordered', note: 'Accepted by telephone' });
  });

  it('asks for the tonnage when marking rolled, records it, then moves the lot; shows the server’s refusal', async () => {
    const user = userEvent.setup();
    signIn('chief_engineer');
    const { spy: fetchSpy } = stubFetch({
      '*': lot({ status: 'on_roll_plan', producedTonnes: 1.9 }),
      '*/transitions': () =>
        json({ statusCode: 409, error: 'Conflict', message: 'Someone else moved this lot a moment ago. Look again and retry.' }, 409),
    });
    render(<LotStatusActions lot={lot({ status: 'on_roll_plan', nextStatus: 'rolled' })} />);
    await user.click(screen.getByRole('button', { name: 'Mark rolled' }));
    const dialog = await screen.findByRole('dialog');
    expect(screen.getByLabelText('Produced, tonnes')).toHaveValue('1.9');
    await user.clear(screen.getByLabelText('Produced, tonnes'));
    await user.type(screen.getByLabelText('Produced, tonnes'), '1.95');
    const confirm = [...dialog.querySelectorAll('button')].find((b) => b.textContent === 'Mark rolled')!;
    await user.click(confirm);
    await waitFor(() => expect(fetchSpy).toHaveBeenCalledTimes(2), { timeout: 5000 });
    const [url1, init1] = fetchSpy.mock.calls[0]!;
    expect(String(url1)).toBe('/api/mill/lots/lot-1');
    expect(init1?.method).toBe('PATCH');
    expect(JSON.parse(String(init1?.body))).toEqual({ producedTonnes: 1.95, scrappedTonnes: 0.1 });
    expect(JSON.parse(String(fetchSpy.mock.calls[1]![1]?.body))).toEqual({ to: 'rolled' });
    expect(await screen.findByRole('alert', {}, { timeout: 5000 })).toHaveTextContent('Someone else moved this lot');
  });

  it('the chief engineer may give a reason to put a lot on the roll plan before its deposit is paid', async () => {
    const user = userEvent.setup();
    signIn('chief_engineer');
    const { spy: fetchSpy } = stubFetch({ '*': lot({ status: 'on_roll_plan', nextStatus: 'rolled' }) });
    render(<LotStatusActions lot={lot({ status: 'ordered', nextStatus: 'on_roll_plan' })} />);
    await user.click(screen.getByRole('button', { name: 'Put on the roll plan' }));
    await user.type(await screen.findByRole('textbox', { name: /before the deposit is paid/ }), 'Regular customer, pays on account');
    await user.click(within(screen.getByRole('dialog')).getByRole('button', { name: 'Put on the roll plan' }));
    await waitFor(() => expect(fetchSpy).toHaveBeenCalled(), { timeout: 10_000 });
    expect(JSON.parse(String(fetchSpy.mock.calls[0]![1]?.body))).toEqual({
      to: 'on_roll_plan',
      overrideReason: 'Regular customer, pays on account',
    });
  });

  it('the mill lead is not offered the override', async () => {
    const user = userEvent.setup();
    signIn('mill_lead');
    render(<LotStatusActions lot={lot({ status: 'ordered', nextStatus: 'on_roll_plan' })} />);
    await user.click(screen.getByRole('button', { name: 'Put on the roll plan' }));
    expect(await screen.findByText(/only the chief engineer may put it there/)).toBeInTheDocument();
    expect(screen.queryByRole('textbox', { name: /before the deposit is paid/ })).not.toBeInTheDocument();
  });
});
