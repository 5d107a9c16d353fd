import type { CardDto } from '@crankjournal/shared-types';
import { cardMissing, cardToDraft, draftToInput, emptyCard, parseOrdinates } from './card-draft';

describe('a card as the form holds it', () => {
  it('reads ordinates separated by spaces, commas or semicolons, and refuses words', () => {
    expect(parseOrdinates('0.9 0.85, 0.8;0.74')).toEqual([0.9, 0.85, 0.8, 0.74]);
    expect(parseOrdinates('')).toEqual([]);
    expect(parseOrdinates('0.9 x')).toBeNull();
  });

  it('says what is missing for each way, and nothing for an end not taken', () => {
    expect(cardMissing(emptyCard())).toBeNull();
    expect(cardMissing(emptyCard({ method: 'planimeter', areaSqIn: 2.6 }))).toBe('give the card length');
    expect(cardMissing(emptyCard({ method: 'ordinates', ordinatesText: '0.5', springPsiPerIn: 60 }))).toBe(
      'give at least two mid-ordinates',
    );
    expect(cardMissing(emptyCard({ method: 'trace', springPsiPerIn: 60, lengthIn: 3.5 }))).toBe('upload the card image');
    expect(cardMissing(emptyCard({ method: 'trace', imageId: 'img', springPsiPerIn: 60, lengthIn: 3.5 }))).toBe(
      'mark the atmospheric line',
    );
  });

  it('sends only the figures of the way chosen', () => {
    const d = emptyCard({
      method: 'planimeter',
      areaSqIn: 2.6,
      lengthIn: 3.6,
      springPsiPerIn: 60,
      ordinatesText: '1 2 3',
      meanEffectivePressurePsi: 40,
    });
    expect(draftToInput(d, 'cyl', 'head')).toEqual({
      cylinderId: 'cyl',
      end: 'head',
      areaSqIn: 2.6,
      lengthIn: 3.6,
      springPsiPerIn: 60,
      cutOffPercent: null,
      compressionPercent: null,
      admissionPressurePsig: null,
      note: null,
    });
    expect(draftToInput(emptyCard(), 'cyl', 'crank')).toBeNull();
  });

  it('a stored card becomes a draft that sends the same figures back', () => {
    const stored = {
      method: 'ordinates',
      springPsiPerIn: 20,
      lengthIn: null,
      areaSqIn: null,
      ordinatesIn: [1.2, 1.1, 1.0],
      givenMeanEffectivePressurePsi: null,
      imageId: null,
      trace: null,
      cutOffPercent: 42,
      compressionPercent: null,
      admissionPressurePsig: 24.5,
      note: 'taken late',
    } as unknown as CardDto;
    expect(draftToInput(cardToDraft(stored), 'c', 'crank')).toMatchObject({
      ordinatesIn: [1.2, 1.1, 1.0],
      springPsiPerIn: 20,
      cutOffPercent: 42,
      admissionPressurePsig: 24.5,
      note: 'taken late',
    });
  });
});
