import type { OutstandingLot } from '@crankjournal/shared-types';
import { act, render, screen, waitFor, within } from '../../../test-utils/render';
import { json, signIn, signOut, stubFetch } from '../../../test-utils/http';
import { navigationFor } from '../../../components/AppShell/navigation';
import OutstandingPage from './Outstanding.page';

/** The live channel, faked: `tell` plays an event from the server. */
const live = vi.hoisted(() => {
  type Handler = (...args: unknown[]) => void;
  const handlers = new Map<string, Set<Handler>>();
  const joined: string[] = [];
  return {
    joined,
    socket: {
      connected: true,
      on: (event: string, h: Handler) => void handlers.set(event, (handlers.get(event) ?? new Set()).add(h)),
      off: (event: string, h: Handler) => void handlers.get(event)?.delete(h),
    },
    tell: (event: string, ...args: unknown[]) => handlers.get(event)?.forEach((h) => h(...args)),
    reset: () => {
      handlers.clear();
      joined.length = 0;
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

function owed(over: Partial<OutstandingLot> = {}): OutstandingLot {
  return {
    lotId: 'lot-1',
    reference: 'BL26-001',
    customerName: 'Forge guild',
    currency: 'GBP',
    quotedMinor: 123456,
    paidMinor: 37037,
    dueMinor: 86419,
    askedKind: 'balance',
    ...over,
  };
}

describe('Money outstanding (administrator)', () => {
  afterEach(() => {
    vi.restoreAllMocks();
    signOut();
    live.reset();
  });

  it('lists each lot with its sums in its currency, linked to the lot, and the total due per currency', async () => {
    signIn('administrator');
    stubFetch({
      'GET /payments/outstanding': [
        owed(),
        owed({ lotId: 'lot-2', reference: 'BL26-002', customerName: 'Valley railway', paidMinor: 0, dueMinor: 50000, askedKind: null }),
        owed({
          lotId: 'lot-3',
          reference: 'BL26-003',
          currency: 'USD',
          quotedMinor: 99900,
          paidMinor: 0,
          dueMinor: 99900,
          askedKind: 'deposit',
        }),
      ],
    });
    render(<OutstandingPage />);
    const table = await screen.findByRole('table', { name: 'Lots with money outstanding' });
    expect(within(table).getByRole('link', { name: 'BL26-001' })).toHaveAttribute('href', '/mill/lots/lot-1');
    expect(within(table).getByRole('link', { name: 'BL26-003' })).toHaveAttribute('href', '/mill/lots/lot-3');
    // Intl.NumberFormat, en-GB, in each lot's currency (common practice, no source).
    expect(screen.getByTestId('due-BL26-001')).toHaveTextContent('£864.19');
    expect(screen.getByTestId('due-BL26-003')).toHaveTextContent('US$999.00');
    const first = within(table).getByRole('link', { name: 'BL26-001' }).closest('tr')!;
    expect(first).toHaveTextContent('£1,234.56');
    expect(first).toHaveTextContent('£370.37');
    expect(first).toHaveTextContent('Balance asked, not yet paid');
    expect(within(table).getByRole('link', { name: 'BL26-002' }).closest('tr')!).toHaveTextContent('Nothing asked yet');
    // £864.19 + £500.00; dollars are not added to pounds.
    expect(screen.getByTestId('due-total-GBP')).toHaveTextContent('£1,364.19');
    expect(screen.getByTestId('due-total-USD')).toHaveTextContent('US$999.00');
  });

  it("is asked again when a lot's money changes on the money room", async () => {
    signIn('administrator');
    let rows = [owed()];
    const { calls } = stubFetch({ 'GET /payments/outstanding': () => json(rows) });
    render(<OutstandingPage />);
    expect(await screen.findByTestId('due-BL26-001')).toHaveTextContent('£864.19');
    expect(live.joined).toEqual(['money']);
    rows = [];
    act(() => live.tell('lot:money', { lotId: 'lot-1' }));
    expect(await screen.findByText('Every lot is paid up.')).toBeInTheDocument();
    await waitFor(() => expect(calls.filter((c) => c.path === '/payments/outstanding')).toHaveLength(2));
  });

  it('is in the navigation for the administrator only (the API answers no one else)', () => {
    const has = (role: Parameters<typeof navigationFor>[0]) =>
      navigationFor(role).some((g) => g.items.some((i) => i.path === '/payments/outstanding'));
    expect(has('administrator')).toBe(true);
    for (const role of ['mill_lead', 'chief_engineer', 'observer', 'operator', 'maintenance_lead'] as const) expect(has(role)).toBe(false);
  });
});
