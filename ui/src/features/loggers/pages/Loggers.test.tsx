import userEvent from '@testing-library/user-event';
import type { LoggerDto } from '@crankjournal/shared-types';
import { render, screen, within } from '../../../test-utils/render';
import { signIn, signOut, stubFetch } from '../../../test-utils/http';
import LoggersPage from './Loggers.page';

const logger: LoggerDto = {
  id: 'l1',
  engineId: 'e1',
  name: 'Bearing thermocouples',
  keyPrefix: 'cjl_ab12',
  createdAt: '2026-05-01T08:00:00Z',
  revokedAt: null,
  lastSeenAt: null,
};

describe('data loggers page', () => {
  beforeEach(() => {
    signIn('administrator', { id: 'u1', email: 'admin@alderforge.example', displayName: 'Admin', unitSystem: 'imperial' });
  });
  afterEach(() => {
    vi.restoreAllMocks();
    signOut();
  });

  it('shows an issued key once, with a copy button and a warning', async () => {
    const user = userEvent.setup();
    const { spy: fetchSpy } = stubFetch({
      '*': [logger],
      '/engines': [{ id: 'e1', name: 'No. 2 engine' }],
      'POST /loggers': { ...logger, id: 'l2', name: 'Oil pressure logger', key: 'cjl_secret_key_123' },
    });
    render(<LoggersPage />);
    expect(await screen.findByText('Bearing thermocouples', {}, { timeout: 8000 })).toBeInTheDocument();
    await user.click(screen.getByRole('button', { name: 'Issue a logger key' }));
    const dialog = await screen.findByRole('dialog');
    await user.clear(within(dialog).getByLabelText(/Logger name/));
    await user.type(within(dialog).getByLabelText(/Logger name/), 'Oil pressure logger');
    await user.click(within(dialog).getByRole('button', { name: 'Issue key' }));
    expect(await screen.findByTestId('issued-key', {}, { timeout: 8000 })).toHaveTextContent('cjl_secret_key_123');
    expect(screen.getByText(/only time the key is shown/)).toBeInTheDocument();
    expect(screen.getByRole('button', { name: 'Copy key' })).toBeInTheDocument();
    const post = fetchSpy.mock.calls.find(([, init]) => init?.method === 'POST')!;
    expect(JSON.parse(String(post[1]!.body))).toEqual({ engineId: 'e1', name: 'Oil pressure logger' });
  }, 20_000);

  it('asks before revoking a key', async () => {
    const user = userEvent.setup();
    const { spy: fetchSpy } = stubFetch({
      '*': [logger],
      '/engines': [{ id: 'e1', name: 'No. 2 engine' }],
      '/loggers/l1/revoke': { ...logger, revokedAt: '2026-05-02T08:00:00Z' },
    });
    render(<LoggersPage />);
    await user.click(await screen.findByRole('button', { name: 'Revoke key' }, { timeout: 8000 }));
    const dialog = await screen.findByRole('dialog');
    expect(dialog).toHaveTextContent('will be refused from now on');
    expect(fetchSpy.mock.calls.some(([u]) => String(u).endsWith('/revoke'))).toBe(false);
    await user.click(within(dialog).getByRole('button', { name: 'Revoke key' }));
    await vi.waitFor(() => expect(fetchSpy.mock.calls.some(([u]) => String(u) === '/api/loggers/l1/revoke')).toBe(true));
  }, 20_000);
});
