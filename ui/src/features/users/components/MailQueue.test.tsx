import type { MailJobDto } from '@crankjournal/shared-types';
import { render, screen } from '../../../test-utils/render';
import { signIn, signOut, stubFetch } from '../../../test-utils/http';
import { MailQueue } from './MailQueue';

const job = (over: Partial<MailJobDto>): MailJobDto => ({
  id: 'j1',
  state: 'completed',
  tries: 1,
  retryLimit: 12,
  to: 'chief@alderforge.example',
  subject: 'High-high alarm on No. 2 engine',
  createdAt: '2026-05-01T08:00:00Z',
  nextTryAt: null,
  completedAt: '2026-05-01T08:00:02Z',
  lastError: null,
  ...over,
});

describe('outgoing e-mail queue', () => {
  beforeEach(() => {
    signIn('administrator', { id: 'u1', email: 'admin@alderforge.example', displayName: 'Admin', unitSystem: 'imperial' });
  });
  afterEach(() => {
    vi.restoreAllMocks();
    signOut();
  });

  it('shows each e-mail with its state in words, its tries and the last failure', async () => {
    stubFetch({
      '/mail/jobs': [
        job({ id: 'j1' }),
        job({
          id: 'j2',
          state: 'retry',
          tries: 4,
          completedAt: null,
          nextTryAt: '2026-05-01T08:01:00Z',
          lastError: 'connect ECONNREFUSED',
        }),
        job({ id: 'j3', state: 'failed', tries: 13, to: 'buyer@example.test', subject: 'Quotation L-12/Q1', completedAt: null }),
      ],
    });
    render(<MailQueue />);
    expect(await screen.findByText('Waiting to try again', {}, { timeout: 8000 })).toBeInTheDocument();
    expect(screen.getByText('Sent')).toBeInTheDocument();
    expect(screen.getByText('Failed')).toBeInTheDocument();
    expect(screen.getByText('4 of 13')).toBeInTheDocument();
    expect(screen.getByText('connect ECONNREFUSED')).toBeInTheDocument();
  });
});
