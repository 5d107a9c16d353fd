import type { AutotraceReason, CardDto, CardInput, CardMethod, CylinderEnd, TraceOrigin } from '@crankjournal/shared-types';
import { emptyTrace, fromCardTrace, toCardTrace, traceMissing, type TraceDraft } from './trace-model';

export type CardDraftMethod = 'none' | CardMethod;

/** The automatic tracer's work on the uploaded photo: under way, a proposal (kept to go back to), refused, or failed. */
export type AutotraceState =
  | { status: 'finding' }
  | { status: 'proposed'; proposal: TraceDraft; confidence: number; reasons: AutotraceReason[] }
  | { status: 'refused'; reasons: AutotraceReason[] }
  | { status: 'failed'; message: string };
type Num = number | '';

/** One card as the form holds it (numbers may still be empty). */
export interface CardDraft {
  method: CardDraftMethod;
  springPsiPerIn: Num;
  lengthIn: Num;
  areaSqIn: Num;
  ordinatesText: string;
  meanEffectivePressurePsi: Num;
  imageId: string | null;
  image: { url: string; widthPx: number; heightPx: number } | null;
  trace: TraceDraft;
  /** Where the trace came from; null while a proposal waits to be accepted, adjusted or set aside. */
  traceOrigin: TraceOrigin | null;
  autotrace: AutotraceState | null;
  cutOffPercent: Num;
  compressionPercent: Num;
  admissionPressurePsig: Num;
  note: string;
}

export const emptyCard = (over: Partial<CardDraft> = {}): CardDraft => ({
  method: 'none',
  springPsiPerIn: '',
  lengthIn: '',
  areaSqIn: '',
  ordinatesText: '',
  meanEffectivePressurePsi: '',
  imageId: null,
  image: null,
  trace: emptyTrace(),
  traceOrigin: null,
  autotrace: null,
  cutOffPercent: '',
  compressionPercent: '',
  admissionPressurePsig: '',
  note: '',
  ...over,
});

/** Ordinates typed as "0.9 0.85, 0.8 …": numbers separated by spaces, commas or semicolons; null if any is not a number. */
export function parseOrdinates(text: string): number[] | null {
  const parts = text
    .split(/[\s,;]+/)
    .map((s) => s.trim())
    .filter(Boolean);
  if (!parts.length) return [];
  const nums = parts.map((s) => Number(s));
  return nums.every((n) => Number.isFinite(n)) ? nums : null;
}

const num = (v: Num): number | null => (v === '' || v === null || v === undefined ? null : Number(v));

/** What the card still lacks before it can be sent, in words; null when it is complete (or not taken). */
export function cardMissing(d: CardDraft): string | null {
  switch (d.method) {
    case 'none':
      return null;
    case 'mep':
      return d.meanEffectivePressurePsi === '' ? 'give the mean effective pressure' : null;
    case 'planimeter':
      if (d.areaSqIn === '') return 'give the planimeter area';
      if (d.lengthIn === '') return 'give the card length';
      return d.springPsiPerIn === '' ? 'give the spring scale' : null;
    case 'ordinates': {
      const o = parseOrdinates(d.ordinatesText);
      if (o === null) return 'the ordinates must be numbers';
      if (o.length < 2) return 'give at least two mid-ordinates';
      return d.springPsiPerIn === '' ? 'give the spring scale' : null;
    }
    case 'trace':
      if (!d.imageId) return 'upload the card image';
      if (d.springPsiPerIn === '') return 'give the spring scale';
      if (d.lengthIn === '') return 'give the card length';
      if (d.autotrace?.status === 'finding' && !d.traceOrigin) return 'wait for the proposed trace (or trace by hand)';
      if (d.autotrace?.status === 'proposed' && !d.traceOrigin) return 'accept the proposed trace, adjust it or trace by hand';
      return traceMissing(d.trace);
  }
}

/** The figures of the card for the API (without its cylinder and end); null if not taken or incomplete. */
export function draftFigures(d: CardDraft): Omit<CardInput, 'cylinderId' | 'end'> | null {
  if (d.method === 'none' || cardMissing(d)) return null;
  const common = {
    cutOffPercent: num(d.cutOffPercent),
    compressionPercent: num(d.compressionPercent),
    admissionPressurePsig: num(d.admissionPressurePsig),
    note: d.note.trim() || null,
  };
  switch (d.method) {
    case 'mep':
      return { ...common, meanEffectivePressurePsi: num(d.meanEffectivePressurePsi) };
    case 'planimeter':
      return { ...common, areaSqIn: num(d.areaSqIn), lengthIn: num(d.lengthIn), springPsiPerIn: num(d.springPsiPerIn) };
    case 'ordinates':
      return { ...common, ordinatesIn: parseOrdinates(d.ordinatesText), springPsiPerIn: num(d.springPsiPerIn) };
    case 'trace':
      return {
        ...common,
        imageId: d.imageId,
        trace: toCardTrace(d.trace),
        traceOrigin: d.traceOrigin,
        lengthIn: num(d.lengthIn),
        springPsiPerIn: num(d.springPsiPerIn),
      };
  }
}

export function draftToInput(d: CardDraft, cylinderId: string, end: CylinderEnd): CardInput | null {
  const f = draftFigures(d);
  return f ? { ...f, cylinderId, end } : null;
}

/** A stored card as a draft, for amending it. */
export function cardToDraft(c: CardDto): CardDraft {
  const n = (v: number | null) => (v === null ? '' : v);
  return emptyCard({
    method: c.method,
    springPsiPerIn: n(c.springPsiPerIn),
    lengthIn: n(c.lengthIn),
    areaSqIn: n(c.areaSqIn),
    ordinatesText: (c.ordinatesIn ?? []).join(' '),
    meanEffectivePressurePsi: n(c.givenMeanEffectivePressurePsi),
    imageId: c.imageId,
    trace: fromCardTrace(c.trace),
    traceOrigin: c.traceOrigin,
    cutOffPercent: n(c.cutOffPercent),
    compressionPercent: n(c.compressionPercent),
    admissionPressurePsig: n(c.admissionPressurePsig),
    note: c.note ?? '',
  });
}

/** The origin of a trace after the person changed it by hand: a proposal's changes make it adjusted, anything else by hand. */
export function originAfterEdit(d: Pick<CardDraft, 'traceOrigin' | 'autotrace'>): TraceOrigin {
  const fromProposal =
    d.traceOrigin === 'proposed-accepted' || d.traceOrigin === 'adjusted' || (!d.traceOrigin && d.autotrace?.status === 'proposed');
  return fromProposal ? 'adjusted' : 'by-hand';
}
