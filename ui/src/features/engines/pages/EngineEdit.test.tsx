import userEvent from '@testing-library/user-event';
import { Route, Routes } from 'react-router-dom';
import { render, screen, waitFor } from '../../../test-utils/render';
import { buildEngine } from '../../../test-utils/builders';
import { json, signIn, signOut, stubFetch } from '../../../test-utils/http';
import EngineEditPage from './EngineEdit.page';

const engine = buildEngine({
  measurementPoints: [
    { id: 'p1', code: 'MB1-T', label: 'Main bearing 1', kind: 'bearing_temperature', unit: 'degF', sequence: 1, highLimit: 130 },
  ],
});

describe('engine edit page', () => {
  beforeEach(() => signIn('chief_engineer', { id: 'u1', email: 'chief@alderforge.example', displayName: 'Chief', unitSystem: 'imperial' }));
  afterEach(() => {
    vi.restoreAllMocks();
    signOut();
  });

  it('puts the whole engine and shows the server’s 400 messages', async () => {
    const user = userEvent.setup();
    const { spy: fetchSpy } = stubFetch({
      '*': () => json(engine),
      'PUT *': () =>
        json(
          {
            statusCode: 400,
            error: 'Bad Request',
            message: ['highHighLimit of MB1-T must be above its highLimit', 'mawpPsig must be positive'],
          },
          400,
        ),
    });
    render(
      <Routes>
        <Route path="/engines/:id/edit" element={<EngineEditPage />} />
      </Routes>,
      { route: '/engines/e1/edit' },
    );
    expect(await screen.findByDisplayValue('No. 2 engine', {}, { timeout: 8000 })).toBeInTheDocument();
    expect(screen.getByLabelText(/High limit \(°F\)/)).toHaveValue('130');
    await user.click(screen.getByRole('button', { name: 'Save engine' }));
    const alert = await screen.findByRole('alert');
    expect(alert).toHaveTextContent('highHighLimit of MB1-T must be above its highLimit');
    expect(alert).toHaveTextContent('mawpPsig must be positive');
    const put = fetchSpy.mock.calls.find(([, init]) => init?.method === 'PUT')!;
    expect(String(put[0])).toBe('/api/engines/e1');
    const body = JSON.parse(String(put[1]!.body));
    expect(body).toMatchObject({
      name: 'No. 2 engine',
      mawpPsig: 150,
      cylinders: [],
      measurementPoints: [{ id: 'p1', code: 'MB1-T', highLimit: 130 }],
    });
  }, 20_000);

  it('does not send when a required field is empty', async () => {
    const user = userEvent.setup();
    const { spy: fetchSpy } = stubFetch({ '*': () => json(engine) });
    render(
      <Routes>
        <Route path="/engines/:id/edit" element={<EngineEditPage />} />
      </Routes>,
      { route: '/engines/e1/edit' },
    );
    const name = await screen.findByDisplayValue('No. 2 engine', {}, { timeout: 8000 });
    await user.clear(name);
    await user.click(screen.getByRole('button', { name: 'Save engine' }));
    await waitFor(() => expect(screen.getByRole('alert')).toHaveTextContent('Some fields need attention'));
    expect(fetchSpy.mock.calls.some(([, init]) => init?.method === 'PUT')).toBe(false);
  }, 20_000);
});
