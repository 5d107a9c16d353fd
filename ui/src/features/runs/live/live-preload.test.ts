import { QueryClient } from '@tanstack/react-query';
import { buildEngine, buildRun } from '../../../test-utils/builders';
import { signIn, signOut, stubFetch } from '../../../test-utils/http';
import { engineKeys } from '../../engines/api/engines.api';
import { runKeys } from '../api/runs.api';
import { preloadLiveRun } from './live-preload';

const RUN = 'run-1';
const ENGINE = 'eng-1';

afterEach(() => {
  vi.restoreAllMocks();
  signOut();
});

describe('live run page preload', () => {
  it("asks for the run's answers side by side, takes the engine from the run's answer, and leaves them in the query cache", async () => {
    signIn('operator', { email: 'x@example.test' }, { accessToken: 'a.b.c' });
    let release = () => {};
    const held = new Promise<void>((r) => (release = r));
    const stub = stubFetch({
      [`GET /runs/${RUN}`]: async () => {
        await held;
        return new Response(
          JSON.stringify({ ...buildRun({ id: RUN, engineId: ENGINE, state: 'running' }), engine: buildEngine({ id: ENGINE }) }),
          {
            status: 200,
            headers: { 'content-type': 'application/json' },
          },
        );
      },
      [`GET /runs/${RUN}/board`]: [],
      [`GET /runs/${RUN}/readings*`]: [],
      [`GET /runs/${RUN}/alarms`]: [],
      'GET /alarms': [],
      'GET /units/conversions': { imperial: {}, metric: {} },
    });
    const qc = new QueryClient({ defaultOptions: { queries: { retry: false } } });
    preloadLiveRun(qc, RUN);
    // While the run's answer is held back, its board, readings and alarms are already asked for.
    await vi.waitFor(() =>
      expect(stub.calls.map((c) => c.path)).toEqual(
        expect.arrayContaining([`/runs/${RUN}/board`, `/runs/${RUN}/readings`, `/runs/${RUN}/alarms`]),
      ),
    );
    release();
    // The engine comes with the run: in its own cache entry, never asked for on its own; the run's entry is the run alone.
    await vi.waitFor(() => expect(qc.getQueryData(engineKeys.detail(ENGINE))).toMatchObject({ id: ENGINE }));
    expect(stub.calls.some((c) => c.path.startsWith('/engines'))).toBe(false);
    expect(qc.getQueryData(runKeys.detail(RUN))).not.toHaveProperty('engine');
    expect(stub.calls.some((c) => c.path === '/alarms' && c.query.get('engineId') === ENGINE)).toBe(true);
    expect(qc.getQueryData(runKeys.detail(RUN))).toMatchObject({ id: RUN, engineId: ENGINE });
    expect(qc.getQueryData(runKeys.board(RUN))).toEqual([]);
  });

  it('asks for no open engine alarms for a closed run, and a failed run read is left to the page', async () => {
    signIn('operator', { email: 'x@example.test' }, { accessToken: 'a.b.c' });
    const stub = stubFetch({
      [`GET /runs/${RUN}`]: { ...buildRun({ id: RUN, engineId: ENGINE, state: 'closed' }), engine: buildEngine({ id: ENGINE }) },
      [`GET /runs/${RUN}/board`]: [],
      [`GET /runs/${RUN}/readings*`]: [],
      [`GET /runs/${RUN}/alarms`]: [],
      'GET /units/conversions': { imperial: {}, metric: {} },
    });
    const qc = new QueryClient({ defaultOptions: { queries: { retry: false } } });
    preloadLiveRun(qc, RUN);
    await vi.waitFor(() => expect(qc.getQueryData(engineKeys.detail(ENGINE))).toBeDefined());
    expect(stub.calls.some((c) => c.path === '/alarms')).toBe(false);

    // Nothing answers: the failure stays in the cache for the page's own query (which asks again), and no engine is asked for.
    const none = stubFetch({});
    const qc2 = new QueryClient({ defaultOptions: { queries: { retry: false } } });
    preloadLiveRun(qc2, 'missing');
    await vi.waitFor(() => expect(qc2.getQueryState(runKeys.detail('missing'))?.status).toBe('error'));
    expect(none.calls.some((c) => c.path.startsWith('/engines'))).toBe(false);
  });
});
