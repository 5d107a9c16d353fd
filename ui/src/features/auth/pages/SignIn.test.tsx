import userEvent from '@testing-library/user-event';
import { render, screen, waitFor } from '../../../test-utils/render';
import { json, stubFetch } from '../../../test-utils/http';
import SignInPage from './SignIn.page';

describe('sign-in page', () => {
  afterEach(() => vi.restoreAllMocks());

  it('asks for an e-mail and password before calling the server', async () => {
    const user = userEvent.setup();
    const { spy: fetchSpy } = stubFetch();
    render(<SignInPage />);
    await user.click(screen.getByRole('button', { name: 'Sign in' }));
    expect(await screen.findByText('Enter your e-mail address')).toBeInTheDocument();
    expect(fetchSpy).not.toHaveBeenCalled();
  });

  it('shows the server’s reason when sign-in is refused', async () => {
    const user = userEvent.setup();
    stubFetch({ '*': () => json({ statusCode: 401, error: 'Unauthorized', message: 'The e-mail or password is not right.' }, 401) });
    render(<SignInPage />);
    await user.clear(screen.getByLabelText('E-mail'));
    await user.type(screen.getByLabelText('E-mail'), 'operator@alderforge.example');
    await user.clear(screen.getByLabelText('Password', { exact: true }));
    await user.type(screen.getByLabelText('Password', { exact: true }), 'wrong');
    await user.click(screen.getByRole('button', { name: 'Sign in' }));
    await waitFor(() => expect(screen.getByRole('alert')).toHaveTextContent('The e-mail or password is not right.'));
  });
});
