import userEvent from '@testing-library/user-event';
import { render, screen, waitFor } from '../../../test-utils/render';
import { signIn, signOut, stubFetch } from '../../../test-utils/http';
import SiteSettingsPage from './SiteSettings.page';

describe('works settings page', () => {
  beforeEach(() => signIn('administrator'));
  afterEach(() => {
    vi.restoreAllMocks();
    signOut();
  });

  it('shows the works and its time zone, and saves a new name with the zone kept', async () => {
    const user = userEvent.setup();
    const { calls } = stubFetch({
      'GET /site/settings': { worksName: 'Alder Forge', timeZone: 'Europe/London', wetSignature: true, depositSharePct: 30 },
      'PUT /site/settings': { worksName: 'Alder Forge heritage works', timeZone: 'Europe/London', wetSignature: true, depositSharePct: 30 },
    });
    render(<SiteSettingsPage />);
    const name = await screen.findByLabelText('Name of the works', {}, { timeout: 8000 });
    expect(name).toHaveValue('Alder Forge');
    expect(screen.getByRole('combobox', { name: 'Time zone of the engine house' })).toHaveValue('Europe/London');
    const saveButton = screen.getByRole('button', { name: 'Save' });
    expect(saveButton).toBeDisabled();
    await user.clear(name);
    await user.type(name, 'Alder Forge heritage works');
    await user.click(saveButton);
    await waitFor(() => expect(calls.some((c) => c.method === 'PUT')).toBe(true), { timeout: 8000 });
    const put = calls.find((c) => c.method === 'PUT');
    expect(put?.body).toEqual({
      worksName: 'Alder Forge heritage works',
      timeZone: 'Europe/London',
      wetSignature: true,
      depositSharePct: 30,
    });
  }, 20_000);

  it('refuses an empty name before sending anything', async () => {
    const user = userEvent.setup();
    const { calls } = stubFetch({
      'GET /site/settings': { worksName: 'Alder Forge', timeZone: 'UTC', wetSignature: false, depositSharePct: 30 },
    });
    render(<SiteSettingsPage />);
    const name = await screen.findByLabelText('Name of the works', {}, { timeout: 8000 });
    await user.clear(name);
    await user.click(screen.getByRole('button', { name: 'Save' }));
    expect(await screen.findByText(/heads every printed record/)).toBeInTheDocument();
    expect(calls.some((c) => c.method === 'PUT')).toBe(false);
  }, 20_000);
});
