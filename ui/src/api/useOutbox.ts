import { useEffect, useMemo, useSyncExternalStore } from 'react';
import { outbox, type Outbox, type OutboxItem } from './outbox';

/**
 * The outbox's state for one run (or all), kept current, and `onSent` when a waiting item reaches the server.
 * Sending is the shell's job (it runs on every screen); this only reads.
 */
export function useOutbox(runId?: string, opts: { onSent?: (item: OutboxItem, result: unknown) => void; queue?: Outbox } = {}) {
  const queue = opts.queue ?? outbox();
  const snap = useSyncExternalStore(queue.subscribe, queue.getSnapshot, queue.getSnapshot);
  const { onSent } = opts;
  useEffect(() => (onSent ? queue.onSent(onSent) : undefined), [queue, onSent]);

  return useMemo(() => {
    const pending = runId ? snap.pending.filter((q) => q.runId === runId) : snap.pending;
    const failed = runId ? snap.failed.filter((q) => q.runId === runId) : snap.failed;
    return { queue, pending, failed, sending: snap.sending, loaded: snap.loaded };
  }, [queue, snap, runId]);
}
