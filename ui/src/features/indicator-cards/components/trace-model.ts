import type { CardTrace, TracePoint } from '@crankjournal/shared-types';

/** A trace being made: calibration marks and outline points, in the image's own pixels. */
export interface TraceDraft {
  atmosphericLine: TracePoint[];
  admissionEndPx: TracePoint | null;
  releaseEndPx: TracePoint | null;
  pointsPx: TracePoint[];
}
export type TraceStep = 'atmosphere' | 'admission' | 'release' | 'outline';
export type TraceTarget =
  { kind: 'atmosphere'; index: number } | { kind: 'admission' } | { kind: 'release' } | { kind: 'point'; index: number };

export const emptyTrace = (): TraceDraft => ({ atmosphericLine: [], admissionEndPx: null, releaseEndPx: null, pointsPx: [] });

export function traceStep(d: TraceDraft): TraceStep {
  if (d.atmosphericLine.length < 2) return 'atmosphere';
  if (!d.admissionEndPx) return 'admission';
  if (!d.releaseEndPx) return 'release';
  return 'outline';
}

export const STEP_WORDS: Record<TraceStep, string> = {
  atmosphere: 'Click two points on the atmospheric line (the straight line drawn with the cock shut).',
  admission: 'Click the admission end of the diagram (where steam comes in), on or near the atmospheric line.',
  release: 'Click the release end of the diagram (the far end of the stroke).',
  outline: 'Click round the outline of the card, in order. Drag a point to move it; Undo takes back the last change.',
};

const round = (p: TracePoint): TracePoint => ({ x: Math.round(p.x * 10) / 10, y: Math.round(p.y * 10) / 10 });

/** What a click at `p` adds, by the step the trace is at. */
export function addMark(d: TraceDraft, p: TracePoint): TraceDraft {
  const q = round(p);
  switch (traceStep(d)) {
    case 'atmosphere':
      return { ...d, atmosphericLine: [...d.atmosphericLine, q] };
    case 'admission':
      return { ...d, admissionEndPx: q };
    case 'release':
      return { ...d, releaseEndPx: q };
    case 'outline':
      return { ...d, pointsPx: [...d.pointsPx, q] };
  }
}

export function movePoint(d: TraceDraft, t: TraceTarget, p: TracePoint): TraceDraft {
  const q = round(p);
  switch (t.kind) {
    case 'atmosphere':
      return { ...d, atmosphericLine: d.atmosphericLine.map((a, i) => (i === t.index ? q : a)) };
    case 'admission':
      return { ...d, admissionEndPx: q };
    case 'release':
      return { ...d, releaseEndPx: q };
    case 'point':
      return { ...d, pointsPx: d.pointsPx.map((a, i) => (i === t.index ? q : a)) };
  }
}

/** The mark nearest to `p` within `radius` (image pixels), outline points first. */
export function hitTest(d: TraceDraft, p: TracePoint, radius: number): TraceTarget | null {
  let best: { t: TraceTarget; d: number } | null = null;
  const consider = (t: TraceTarget, q: TracePoint | null) => {
    if (!q) return;
    const dist = Math.hypot(q.x - p.x, q.y - p.y);
    if (dist <= radius && (!best || dist < best.d)) best = { t, d: dist };
  };
  d.pointsPx.forEach((q, index) => consider({ kind: 'point', index }, q));
  d.atmosphericLine.forEach((q, index) => consider({ kind: 'atmosphere', index }, q));
  consider({ kind: 'admission' }, d.admissionEndPx);
  consider({ kind: 'release' }, d.releaseEndPx);
  return best ? (best as { t: TraceTarget }).t : null;
}

/** The trace as the API takes it, once calibrated and with at least three outline points; else null. */
export function toCardTrace(d: TraceDraft): CardTrace | null {
  if (d.atmosphericLine.length !== 2 || !d.admissionEndPx || !d.releaseEndPx || d.pointsPx.length < 3) return null;
  return {
    atmosphericLine: [d.atmosphericLine[0], d.atmosphericLine[1]],
    admissionEndPx: d.admissionEndPx,
    releaseEndPx: d.releaseEndPx,
    pointsPx: d.pointsPx,
  };
}

export function fromCardTrace(t: CardTrace | null | undefined): TraceDraft {
  if (!t) return emptyTrace();
  return {
    atmosphericLine: [...t.atmosphericLine],
    admissionEndPx: t.admissionEndPx,
    releaseEndPx: t.releaseEndPx,
    pointsPx: [...t.pointsPx],
  };
}

/** What is still missing before the trace can be used, in words. */
export function traceMissing(d: TraceDraft): string | null {
  const step = traceStep(d);
  if (step === 'atmosphere') return 'mark the atmospheric line';
  if (step === 'admission') return 'mark the admission end of the diagram';
  if (step === 'release') return 'mark the release end of the diagram';
  if (d.pointsPx.length < 3) return 'trace at least three points of the outline';
  return null;
}
