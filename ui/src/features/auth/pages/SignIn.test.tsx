import { render, screen, fireEvent, waitFor } from '../../../test-utils/render';
import SignInPage from './SignIn.page';

describe('sign-in page', () => {
  afterEach(() => vi.restoreAllMocks());

  it('asks for an e-mail and password before calling the server', async () => {
    const fetchSpy = vi.spyOn(globalThis, 'fetch');
    render(<SignInPage />);
    fireEvent.click(screen.getByRole('button', { name: 'Sign in' }));
    expect(await screen.findByText('Enter your e-mail address')).toBeInTheDocument();
    expect(fetchSpy).not.toHaveBeenCalled();
  });

  it('shows the server’s reason when sign-in is refused', async () => {
    vi.spyOn(globalThis, 'fetch').mockResolvedValue(
      new Response(JSON.stringify({ statusCode: 401, error: 'Unauthorized', message: 'The e-mail or password is not right.' }), {
        status: 401,
        headers: { 'content-type': 'application/json' },
      }),
    );
    render(<SignInPage />);
    fireEvent.change(screen.getByLabelText('E-mail'), { target: { value: 'operator@alderforge.example' } });
    fireEvent.change(screen.getByLabelText('Password', { exact: true }), { target: { value: 'wrong' } });
    fireEvent.click(screen.getByRole('button', { name: 'Sign in' }));
    await waitFor(() => expect(screen.getByRole('alert')).toHaveTextContent('The e-mail or password is not right.'));
  });
});
