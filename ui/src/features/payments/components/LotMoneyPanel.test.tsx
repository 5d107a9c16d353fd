import userEvent from '@testing-library/user-event';
import { MONEY_ROOM, type LotMoney, type PaymentDto } from '@crankjournal/shared-types';
import { act, render, screen, waitFor, within } from '../../../test-utils/render';
import { lot } from '../../../test-utils/fixtures/mill';
import { json, signIn, signOut, stubFetch } from '../../../test-utils/http';
import { OFFLINE_POLL_MS, lotMoneyQuery } from '../api/payments.api';
import { LotMoneyPanel, minorMoney } from './LotMoneyPanel';

/** The live channel, faked: the rooms joined, and `tell` plays an event from the server. */
const live = vi.hoisted(() => {
  type Handler = (...args: unknown[]) => void;
  const handlers = new Map<string, Set<Handler>>();
  const joined: string[] = [];
  const socket = {
    connected: true,
    on: (event: string, h: Handler) => void handlers.set(event, (handlers.get(event) ?? new Set()).add(h)),
    off: (event: string, h: Handler) => void handlers.get(event)?.delete(h),
  };
  return {
    socket,
    joined,
    tell: (event: string, ...args: unknown[]) => handlers.get(event)?.forEach((h) => h(...args)),
    reset: () => {
      handlers.clear();
      joined.length = 0;
      socket.connected = true;
    },
  };
});
vi.mock('../../../api/socket', () => ({
  getSocket: () => live.socket,
  joinRoom: (room: string) => {
    live.joined.push(room);
    return () => {};
  },
  closeSocket: () => {},
}));

vi.setConfig({ testTimeout: 30_000 });

function payment(over: Partial<PaymentDto> = {}): PaymentDto {
  return {
    id: 'pay-1',
    lotId: 'lot-1',
    kind: 'deposit',
    state: 'asked',
    amountMinor: 37037,
    refundedMinor: 0,
    currency: 'GBP',
    checkoutUrl: 'http://127.0.0.1:4242/pay/cs_test_1',
    emailedTo: 'orders@forge-guild.example',
    askedByName: 'Mill Lead',
    askedAt: '2026-12-01T10:00:00Z',
    paidAt: null,
    declineReason: null,
    refunds: [],
    ...over,
  };
}
function money(over: Partial<LotMoney> = {}): LotMoney {
  return {
    lotId: 'lot-1',
    reference: 'BL26-001',
    currency: 'GBP',
    quotedMinor: 123456,
    depositSharePct: 30,
    askedMinor: 0,
    paidMinor: 0,
    refundedMinor: 0,
    dueMinor: 123456,
    depositPaid: false,
    settled: false,
    payments: [],
    ...over,
  };
}

describe('LotMoneyPanel', () => {
  afterEach(() => {
    vi.restoreAllMocks();
    signOut();
    live.reset();
  });

  it('formats minor units in the currency (common practice, no source)', () => {
    expect(minorMoney(123456, 'GBP')).toBe('£1,234.56');
    expect(minorMoney(1500, 'JPY')).toBe('JP¥1,500');
  });

  it('the mill lead asks for the deposit as the site share of the quote', async () => {
    const user = userEvent.setup();
    signIn('mill_lead');
    let now = money();
    const { calls } = stubFetch({
      'GET /payments/lots/:id': () => json(now),
      'POST /payments/lots/:id/requests': () => {
        now = money({ askedMinor: 37037, payments: [payment()] });
        return json(now);
      },
    });
    render(<LotMoneyPanel lot={lot({ id: 'lot-1', status: 'priced' })} />);
    await user.click(await screen.findByRole('button', { name: 'Ask for the deposit' }));
    await user.click(await screen.findByRole('button', { name: 'Send the payment link' }));
    await waitFor(() => expect(calls.some((c) => c.method === 'POST')).toBe(true), { timeout: 5000 });
    expect(calls.find((c) => c.method === 'POST')!.body).toEqual({ kind: 'deposit', sharePct: 30 });
    expect(await screen.findByRole('link', { name: 'Payment page' })).toHaveAttribute('href', 'http://127.0.0.1:4242/pay/cs_test_1');
  });

  it('shows a declined attempt with its reason; asks the server again only while the live channel is down', async () => {
    signIn('observer');
    stubFetch({ 'GET /payments/lots/:id': money({ payments: [payment({ declineReason: 'Your card was declined. generic_decline' })] }) });
    render(<LotMoneyPanel lot={lot({ id: 'lot-1', status: 'ordered' })} />);
    expect(await screen.findByText('Last attempt failed: Your card was declined. generic_decline')).toBeInTheDocument();
    expect(screen.queryByRole('button', { name: 'Ask for the deposit' })).not.toBeInTheDocument();
    const interval = (live: boolean) =>
      lotMoneyQuery('lot-1', { live }).refetchInterval as (q: { state: { data: LotMoney | undefined } }) => number | false;
    const asked = { state: { data: money({ payments: [payment()] }) } };
    expect(interval(true)(asked)).toBe(false);
    expect(interval(false)(asked)).toBe(OFFLINE_POLL_MS);
    expect(interval(false)({ state: { data: money({ payments: [payment({ state: 'paid' })] }) } })).toBe(false);
  });

  const paid = () =>
    money({ paidMinor: 37037, dueMinor: 86419, depositPaid: true, payments: [payment({ state: 'paid', checkoutUrl: null })] });

  it('a payment told on the money room shows at once, without asking the server again', async () => {
    signIn('mill_lead');
    const { calls } = stubFetch({ 'GET /payments/lots/:id': money({ askedMinor: 37037, payments: [payment()] }) });
    render(<LotMoneyPanel lot={lot({ id: 'lot-1', status: 'ordered' })} />);
    expect(await screen.findByTestId('payment-deposit')).toHaveTextContent('Asked');
    expect(live.joined).toEqual([MONEY_ROOM]);
    const asked = calls.filter((c) => c.path === '/payments/lots/lot-1').length;
    // Another lot's money changes nothing here.
    act(() => live.tell('lot:money', { ...paid(), lotId: 'lot-2' }));
    expect(screen.getByTestId('payment-deposit')).toHaveTextContent('Asked');
    act(() => live.tell('lot:money', paid()));
    expect(await screen.findByTestId('payment-deposit')).toHaveTextContent('Paid');
    expect(screen.getByTestId('money-paid')).toHaveTextContent('£370.37');
    expect(calls.filter((c) => c.path === '/payments/lots/lot-1')).toHaveLength(asked);
  });

  it('the mill lead sees a paid deposit and cannot refund it', async () => {
    signIn('mill_lead');
    stubFetch({ 'GET /payments/lots/:id': paid() });
    render(<LotMoneyPanel lot={lot({ id: 'lot-1', status: 'ordered' })} />);
    expect(await screen.findByTestId('payment-deposit')).toHaveTextContent('Paid');
    expect(screen.queryByRole('button', { name: 'Refund' })).not.toBeInTheDocument();
  });

  it('the administrator refunds a paid deposit with a reason', async () => {
    const user = userEvent.setup();
    signIn('administrator');
    const { calls } = stubFetch({ 'GET /payments/lots/:id': paid(), 'POST /payments/:id/refunds': paid() });
    render(<LotMoneyPanel lot={lot({ id: 'lot-1', status: 'ordered' })} />);
    await user.click(await screen.findByRole('button', { name: 'Refund' }));
    await user.type(await screen.findByRole('textbox', { name: /Reason/ }), 'Lot withdrawn');
    await user.click(within(await screen.findByRole('dialog')).getByRole('button', { name: 'Refund' }));
    await waitFor(() => expect(calls.map((c) => c.method)).toContain('POST'), { timeout: 10_000 });
    expect(calls.find((c) => c.method === 'POST')!.body).toEqual({ reason: 'Lot withdrawn' });
  });

  it('operators see no money and ask for none', () => {
    signIn('operator');
    const { calls } = stubFetch({});
    render(<LotMoneyPanel lot={lot({ id: 'lot-1' })} />);
    expect(screen.queryByText('Money')).not.toBeInTheDocument();
    expect(calls).toHaveLength(0);
    expect(live.joined).toEqual([]);
  });
});
