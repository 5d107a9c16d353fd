import type { AutotraceProposal } from '@crankjournal/shared-types';
import type { AutotraceAnswer } from './autotrace.worker';

/**
 * The automatic tracer's proposal for a card photo, worked out in the browser (a worker, so the page stays
 * responsive and it works without the network). Rejects when the browser cannot decode the file.
 */
export function proposeTraceInBrowser(file: Blob): Promise<AutotraceProposal> {
  return new Promise((resolve, reject) => {
    if (typeof Worker === 'undefined') {
      reject(new Error('this browser cannot trace in the background'));
      return;
    }
    const worker = new Worker(new URL('./autotrace.worker.ts', import.meta.url), { type: 'module' });
    worker.onmessage = (e: MessageEvent<AutotraceAnswer>) => {
      worker.terminate();
      if (e.data.ok) resolve(e.data.proposal);
      else reject(new Error(e.data.message));
    };
    worker.onerror = (e) => {
      worker.terminate();
      reject(new Error(e.message || 'the tracer stopped'));
    };
    worker.postMessage(file);
  });
}
