import { useEffect, useMemo, useSyncExternalStore } from 'react';
import type { IngestResult } from '@crankjournal/shared-types';
import { getSocket } from '../../../api/socket';
import { offlineQueue, type OfflineRoundQueue } from './offline-queue';

/**
 * The offline queue's state for one run (or all), kept current; while mounted it retries on socket
 * reconnect, on `online` and every 10 s, and calls `onSent` when a waiting round reaches the server.
 */
export function useOfflineQueue(
  runId?: string,
  opts: { onSent?: (runId: string, result: IngestResult) => void; queue?: OfflineRoundQueue } = {},
) {
  const queue = opts.queue ?? offlineQueue();
  const snap = useSyncExternalStore(queue.subscribe, queue.getSnapshot, queue.getSnapshot);
  const { onSent } = opts;

  useEffect(() => queue.startAutoRetry(getSocket()), [queue]);
  useEffect(() => (onSent ? queue.onSent(onSent) : undefined), [queue, onSent]);

  return useMemo(() => {
    const pending = runId ? snap.pending.filter((q) => q.runId === runId) : snap.pending;
    const failed = runId ? snap.failed.filter((q) => q.runId === runId) : snap.failed;
    return { queue, pending, failed, sending: snap.sending };
  }, [queue, snap, runId]);
}
