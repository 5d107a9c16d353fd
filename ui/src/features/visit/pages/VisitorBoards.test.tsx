import { Route, Routes } from 'react-router-dom';
import userEvent from '@testing-library/user-event';
import type { VisitorBoardDto } from '@crankjournal/shared-types';
import { render, screen, waitFor } from '../../../test-utils/render';
import { signIn, signOut, stubFetch } from '../../../test-utils/http';
import VisitorBoardsPage from './VisitorBoards.page';
import VisitorBoardQrPage from './VisitorBoardQr.page';

const board: VisitorBoardDto = {
  id: '11111111-1111-4111-8111-111111111111',
  scope: 'run',
  engineId: '22222222-2222-4222-8222-222222222222',
  runId: '33333333-3333-4333-8333-333333333333',
  followsLabel: 'Winter open day',
  enabled: true,
  slug: 'Abcdefghijklmnopqrstuvwx',
  path: '/visit/Abcdefghijklmnopqrstuvwx',
  story: 'Built for the rolling mill.',
  hasPhoto: false,
  updatedAt: '2026-12-05T10:00:00.000Z',
};

describe("the chief engineer's visitor boards", () => {
  beforeEach(() => signIn('chief_engineer'));
  afterEach(() => {
    vi.restoreAllMocks();
    signOut();
  });

  it('switches a board off, makes a new address and saves the story', async () => {
    const user = userEvent.setup();
    const { calls } = stubFetch({
      'GET /visitor-boards': [board],
      'GET /runs': [],
      'GET /engines': [],
      'PATCH /visitor-boards/:id': { ...board, enabled: false },
      'POST /visitor-boards/:id/slug': { ...board, slug: 'Newnewnewnewnewnewnewnew' },
    });
    render(<VisitorBoardsPage />);
    expect(await screen.findByRole('heading', { name: 'Winter open day' }, { timeout: 8000 })).toBeInTheDocument();
    expect(screen.getByRole('link', { name: /\/visit\/Abcdefghijklmnopqrstuvwx$/ })).toBeInTheDocument();
    await user.click(screen.getByRole('switch', { name: /On: visitors can see it/ }));
    await waitFor(() => expect(calls.find((c) => c.method === 'PATCH')?.body).toEqual({ enabled: false }));
    await user.click(screen.getByRole('button', { name: 'New address' }));
    await waitFor(() => expect(calls.some((c) => c.method === 'POST' && c.path === `/visitor-boards/${board.id}/slug`)).toBe(true));
    const story = screen.getByLabelText("The engine's story");
    await user.type(story, ' It ran for sixty years.');
    await user.click(screen.getByRole('button', { name: 'Save the story' }));
    await waitFor(() =>
      expect(calls.filter((c) => c.method === 'PATCH').at(-1)?.body).toEqual({
        story: 'Built for the rolling mill. It ran for sixty years.',
      }),
    );
  }, 20_000);

  it('prints a QR code of the public address', async () => {
    stubFetch({ 'GET /visitor-boards': [board] });
    render(
      <Routes>
        <Route path="/visitor-boards/:id/qr" element={<VisitorBoardQrPage />} />
      </Routes>,
      { route: `/visitor-boards/${board.id}/qr` },
    );
    const qr = await screen.findByTestId('visit-qr', {}, { timeout: 8000 });
    expect(qr).toHaveAccessibleName(`QR code for ${window.location.origin}${board.path}`);
    expect(qr.querySelector('svg')).not.toBeNull();
    expect(screen.getByText(`${window.location.origin}${board.path}`)).toBeInTheDocument();
  }, 20_000);
});
