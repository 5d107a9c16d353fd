import type { ReactNode } from 'react';
import { act, renderHook, waitFor } from '@testing-library/react';
import { QueryClient, QueryClientProvider, useQuery } from '@tanstack/react-query';
import { runKeys } from '../api/runs.api';
import { useLiveRun } from './useLiveRun';

/** A socket that has not connected yet, whose events the test fires. */
const fake = vi.hoisted(() => {
  const handlers = new Map<string, Set<(...a: unknown[]) => void>>();
  return {
    connected: false,
    on(ev: string, fn: (...a: unknown[]) => void) {
      if (!handlers.has(ev)) handlers.set(ev, new Set());
      handlers.get(ev)!.add(fn);
    },
    off(ev: string, fn: (...a: unknown[]) => void) {
      handlers.get(ev)?.delete(fn);
    },
    fire(ev: string) {
      for (const fn of handlers.get(ev) ?? []) fn();
    },
  };
});
vi.mock('../../../api/socket', () => ({ getSocket: () => fake, joinRoom: () => () => {} }));

describe('live run catch-up on connecting', () => {
  it('asks again for what was read before the room was joined, without cutting off a read still on its way', async () => {
    const qc = new QueryClient({ defaultOptions: { queries: { retry: false, staleTime: 60_000 } } });
    const wrapper = ({ children }: { children: ReactNode }) => <QueryClientProvider client={qc}>{children}</QueryClientProvider>;
    let release: (v: never[]) => void = () => {};
    const board = vi.fn((): Promise<never[]> => (board.mock.calls.length === 1 ? new Promise((r) => (release = r)) : Promise.resolve([])));
    const readings = vi.fn(() => Promise.resolve([]));
    renderHook(
      () => {
        useQuery({ queryKey: runKeys.board('r1'), queryFn: board });
        useQuery({ queryKey: runKeys.readings('r1'), queryFn: readings });
        return useLiveRun('r1');
      },
      { wrapper },
    );
    await waitFor(() => expect(readings).toHaveBeenCalledTimes(1));
    expect(board).toHaveBeenCalledTimes(1);

    act(() => fake.fire('connect'));
    // The finished read is asked for again at once; the board's read, still on its way, is left to finish.
    await waitFor(() => expect(readings).toHaveBeenCalledTimes(2));
    expect(board).toHaveBeenCalledTimes(1);
    // Once it is in, it is asked for again: it may have been read before the room was joined.
    act(() => release([]));
    await waitFor(() => expect(board).toHaveBeenCalledTimes(2));
  });
});
