import type { CardDto, CardInput, CardMethod, CylinderEnd } from '@crankjournal/shared-types';
import { emptyTrace, fromCardTrace, toCardTrace, traceMissing, type TraceDraft } from './trace-model';

export type CardDraftMethod = 'none' | CardMethod;
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
    cutOffPercent: n(c.cutOffPercent),
    compressionPercent: n(c.compressionPercent),
    admissionPressurePsig: n(c.admissionPressurePsig),
    note: c.note ?? '',
  });
}
