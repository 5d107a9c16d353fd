import { act } from 'react';
import { Route, Routes } from 'react-router-dom';
import userEvent from '@testing-library/user-event';
import type { VisitorBoardView, VisitorFigures } from '@crankjournal/shared-types';
import { render, screen, waitFor, within } from '../../../test-utils/render';
import { json, stubFetch } from '../../../test-utils/http';
import { flywheelDegrees } from '../components/Flywheel';
import { figureTexts, unitsForLocale } from '../model/visitor-units';
import VisitPage from './Visit.page';

type Listener = (payload: unknown) => void;
/** A stand-in for the /visit socket: the test plays the server's events. */
class FakeSocket {
  listeners = new Map<string, Listener[]>();
  disconnected = false;
  on(event: string, fn: Listener) {
    this.listeners.set(event, [...(this.listeners.get(event) ?? []), fn]);
    return this;
  }
  disconnect() {
    this.disconnected = true;
    return this;
  }
  serverSends(event: string, payload?: unknown) {
    act(() => (this.listeners.get(event) ?? []).forEach((fn) => fn(payload)));
  }
}
const sockets: FakeSocket[] = [];
vi.mock('../api/visit.api', async (importOriginal) => ({
  ...(await importOriginal<typeof import('../api/visit.api')>()),
  openVisitSocket: () => {
    const s = new FakeSocket();
    sockets.push(s);
    return s;
  },
}));

const resting: VisitorFigures = {
  state: 'resting',
  speedRpm: null,
  revolutionsSinceStart: null,
  steamPressurePsig: null,
  steamPressureBar: null,
  indicatedHorsepower: 168.2,
  indicatedKilowatts: 125.4,
  horses: 168,
  smallCarEngines: 1.7,
  delaySeconds: 5,
  at: '2026-12-05T10:00:00.000Z',
};
const view: VisitorBoardView = {
  slug: 'Abcdefghijklmnopqrstuvwx',
  engineName: 'No. 2 engine',
  title: 'Winter open day',
  story: 'Built for the rolling mill.\n\nIt drove it for sixty years.',
  photoPath: null,
  figures: resting,
};

function renderAt(path: string) {
  return render(
    <Routes>
      <Route path="/visit/:slug" element={<VisitPage />} />
    </Routes>,
    { route: path },
  );
}

describe('the visitor board page', () => {
  afterEach(() => {
    vi.restoreAllMocks();
    sockets.splice(0);
    window.localStorage.clear();
  });

  it('shows the resting engine, the power in everyday terms and the story, then updates live from the socket', async () => {
    stubFetch({ 'GET /visit/:slug': view });
    renderAt(`/visit/${view.slug}`);
    expect(await screen.findByRole('heading', { name: 'Winter open day' })).toBeInTheDocument();
    expect(screen.getByTestId('engine-state')).toHaveTextContent('The engine is resting');
    expect(screen.getByTestId('equivalents')).toHaveTextContent('168 horses');
    expect(screen.getByTestId('equivalents')).toHaveTextContent('1.7 small car engines');
    expect(screen.getByText('It drove it for sixty years.')).toBeInTheDocument();
    expect(screen.getByRole('img', { name: 'The flywheel, at rest' })).toBeInTheDocument();
    await waitFor(() => expect(sockets).toHaveLength(1));

    sockets[0].serverSends('visit:figures', {
      ...resting,
      state: 'working',
      speedRpm: 72.4,
      revolutionsSinceStart: 1234,
      steamPressurePsig: 130,
      steamPressureBar: 9,
    });
    expect(screen.getByTestId('engine-state')).toHaveTextContent('The engine is working');
    expect(within(screen.getByTestId('figure-Speed')).getByText('72')).toBeInTheDocument();
    expect(screen.getByRole('img', { name: 'The flywheel turning at 72 turns a minute' })).toBeInTheDocument();
  });

  it('switches units: metric shows bar and kilowatts, imperial psi and horsepower, and remembers the choice', async () => {
    const user = userEvent.setup();
    stubFetch({ 'GET /visit/:slug': { ...view, figures: { ...resting, state: 'working', steamPressurePsig: 130, steamPressureBar: 9 } } });
    renderAt(`/visit/${view.slug}`);
    await screen.findByRole('heading', { name: 'Winter open day' });
    await user.click(screen.getByRole('radio', { name: 'Metric' }));
    expect(screen.getByTestId('figure-Steam pressure')).toHaveTextContent('bar');
    expect(screen.getByTestId('figure-Power')).toHaveTextContent('kilowatts');
    await user.click(screen.getByRole('radio', { name: 'Imperial' }));
    expect(screen.getByTestId('figure-Steam pressure')).toHaveTextContent('lb per square inch');
    expect(screen.getByTestId('figure-Power')).toHaveTextContent('horsepower');
    expect(window.localStorage.getItem('cj-visit-units')).toBe('imperial');
  });

  it('says so when the board is switched off, and when it ends while open', async () => {
    stubFetch({ 'GET /visit/:slug': () => json({ statusCode: 404, message: 'switched off' }, 404) });
    renderAt('/visit/Zyxwvutsrqponmlkjihgfedc');
    expect(await screen.findByRole('heading', { name: 'No visitor board here' })).toBeInTheDocument();
    expect(sockets).toHaveLength(0);
  });

  it('ends the page when the board is switched off while a visitor watches', async () => {
    stubFetch({ 'GET /visit/:slug': view });
    renderAt(`/visit/${view.slug}`);
    await screen.findByRole('heading', { name: 'Winter open day' });
    await waitFor(() => expect(sockets).toHaveLength(1));
    sockets[0].serverSends('visit:ended', { message: 'This visitor board has been switched off.' });
    expect(screen.getByRole('heading', { name: 'The visitor board has ended' })).toBeInTheDocument();
    expect(sockets[0].disconnected).toBe(true);
  });

  it('big-screen mode (?wall): the wall layout, and the screen kept awake where the browser can', async () => {
    const release = vi.fn(() => Promise.resolve());
    const request = vi.fn(() => Promise.resolve({ release }));
    Object.defineProperty(navigator, 'wakeLock', { value: { request }, configurable: true });
    stubFetch({ 'GET /visit/:slug': view });
    const { unmount } = renderAt(`/visit/${view.slug}?wall`);
    expect(await screen.findByTestId('visit-wall')).toBeInTheDocument();
    expect(screen.queryByText('It drove it for sixty years.')).not.toBeInTheDocument();
    await waitFor(() => expect(request).toHaveBeenCalledWith('screen'));
    unmount();
    await waitFor(() => expect(release).toHaveBeenCalled());
    Reflect.deleteProperty(navigator, 'wakeLock');
  });
});

describe('visitor units and the flywheel', () => {
  it('takes the units from the locale', () => {
    expect(unitsForLocale('en-US')).toBe('imperial');
    expect(unitsForLocale('en-GB')).toBe('metric');
    expect(unitsForLocale('de-DE')).toBe('metric');
    expect(unitsForLocale(undefined)).toBe('metric');
  });
  it('shows a dash for a figure the engine does not give', () => {
    expect(figureTexts(resting, 'metric', 'en-GB').speed.value).toBe('—');
  });
  it('turns 360 degrees a second at 60 rpm and 75 degrees in 200 ms at 62.5 rpm (rpm × 360° / 60 s; common practice, no source)', () => {
    expect(flywheelDegrees(60, 1000)).toBeCloseTo(360, 9);
    expect(flywheelDegrees(62.5, 200)).toBeCloseTo(75, 9);
    expect(flywheelDegrees(0, 5000)).toBe(0);
  });
});
