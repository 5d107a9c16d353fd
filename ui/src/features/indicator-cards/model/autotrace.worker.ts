/**
 * Proposes the trace of a card photo off the page's thread: decodes the file (PNG, JPEG or WebP, whatever the
 * browser reads) and runs the shared tracer on its pixels. Works offline: nothing leaves the browser.
 */
import { proposeCardTrace, type AutotraceProposal } from '@crankjournal/shared-types';

export type AutotraceAnswer = { ok: true; proposal: AutotraceProposal; ms: number } | { ok: false; message: string };

/** The worker's own scope (the UI is typed with the page's DOM library, not the worker's). */
const scope = self as unknown as { onmessage: ((e: MessageEvent<Blob>) => void) | null; postMessage: (answer: AutotraceAnswer) => void };

scope.onmessage = (e: MessageEvent<Blob>) => void answer(e.data);

async function answer(file: Blob) {
  try {
    const t0 = performance.now();
    const bitmap = await createImageBitmap(file);
    const canvas = new OffscreenCanvas(bitmap.width, bitmap.height);
    const ctx = canvas.getContext('2d', { willReadFrequently: true })!;
    ctx.drawImage(bitmap, 0, 0);
    const pixels = ctx.getImageData(0, 0, bitmap.width, bitmap.height);
    bitmap.close();
    const proposal = proposeCardTrace({ data: pixels.data, width: pixels.width, height: pixels.height });
    scope.postMessage({ ok: true, proposal, ms: performance.now() - t0 } satisfies AutotraceAnswer);
  } catch (err) {
    scope.postMessage({ ok: false, message: err instanceof Error ? err.message : String(err) } satisfies AutotraceAnswer);
  }
}
