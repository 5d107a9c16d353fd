import userEvent from '@testing-library/user-event';
import type { QualificationDto, QualificationMatrix } from '@crankjournal/shared-types';
import { render, screen, within } from '../../../test-utils/render';
import { signIn, signOut, stubFetch } from '../../../test-utils/http';
import QualificationsPage from './Qualifications.page';

const q = (p: Partial<QualificationDto>): QualificationDto => ({
  id: 'q1',
  userId: 'u2',
  userName: 'Cyril Dunnock',
  engineId: 'e1',
  engineName: 'No. 2 engine',
  duty: 'start_and_run',
  grantedOn: '2025-11-19',
  expiresOn: '2026-11-19',
  notes: '',
  status: 'expired',
  daysToExpiry: -12,
  grantedByName: 'Hester Quarmby',
  grantedAt: '2025-11-19T10:00:00Z',
  updatedAt: '2025-11-19T10:00:00Z',
  withdrawnAt: null,
  withdrawnByName: null,
  withdrawnReason: null,
  ...p,
});

const expired = q({});
const matrix: QualificationMatrix = {
  engineId: 'e1',
  engineName: 'No. 2 engine',
  today: '2026-12-01',
  warningDays: 30,
  duties: ['pre_lube', 'start_and_run', 'shutdown', 'mill_operation'],
  rows: [
    {
      userId: 'u2',
      displayName: 'Cyril Dunnock',
      role: 'operator',
      cells: { pre_lube: null, start_and_run: expired, shutdown: null, mill_operation: null },
    },
  ],
  attention: [expired],
};

describe('QualificationsPage', () => {
  afterEach(() => {
    vi.restoreAllMocks();
    signOut();
  });

  it('gives the chief engineer the crew matrix, with what has expired, and a way to grant', async () => {
    const user = userEvent.setup();
    signIn('chief_engineer');
    stubFetch({ '*': [], '*/engines': [{ id: 'e1', name: 'No. 2 engine' }], '/qualifications/matrix': matrix });
    render(<QualificationsPage />);
    const table = await screen.findByTestId('qualifications-matrix');
    expect(within(table).getByText('Cyril Dunnock')).toBeInTheDocument();
    expect(within(table).getByText('Expired')).toBeInTheDocument();
    expect(screen.getByTestId('qualifications-attention')).toHaveTextContent('Cyril Dunnock — Start and run');
    await user.click(within(table).getByRole('button', { name: 'Cyril Dunnock, Pre-lube: not qualified' }));
    expect(await screen.findByRole('button', { name: 'Grant qualification' })).toBeInTheDocument();
  }, 20_000);

  it('shows an operator their own qualifications only', async () => {
    signIn('operator');
    const { spy } = stubFetch({ '*': [q({ status: 'current', daysToExpiry: 200, expiresOn: '2027-06-19', userName: 'Test Person' })] });
    render(<QualificationsPage />);
    expect(await screen.findByRole('table', { name: 'Your qualifications' })).toHaveTextContent('Start and run');
    expect(screen.queryByRole('tab', { name: 'Crew' })).toBeNull();
    expect(spy.mock.calls.map(([u]) => String(u))).toEqual(['/api/qualifications/mine']);
  });
});
