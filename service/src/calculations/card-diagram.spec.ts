import { highestPressurePsig, lowerLinePressurePsig, outlineCrossingsPsig, upperLinePressurePsig } from './card-diagram.js';

// Outlines by elementary geometry (straight lines between vertices; common practice, no source).
const pt = (strokeFraction: number, pressurePsig: number) => ({ strokeFraction, pressurePsig });

describe('reading a card outline', () => {
  // A trapezoid card: steam line falls straight from 100 psig at the admission end to 40 psig at
  // release; exhaust line flat at 5 psig.
  const trapezoid = [pt(0, 100), pt(1, 40), pt(1, 5), pt(0, 5)];

  it('upper line at a quarter stroke is 100 − 60 × 0.25 = 85 psig; lower line is the exhaust at 5 psig', () => {
    expect(upperLinePressurePsig(trapezoid, 0.25)).toBeCloseTo(85, 12);
    expect(lowerLinePressurePsig(trapezoid, 0.25)).toBeCloseTo(5, 12);
  });

  it('the same whichever way round the outline was traced', () => {
    const reversed = [...trapezoid].reverse();
    expect(upperLinePressurePsig(reversed, 0.6)).toBeCloseTo(100 - 60 * 0.6, 12);
    expect(lowerLinePressurePsig(reversed, 0.6)).toBeCloseTo(5, 12);
  });

  it('at a vertex, counts the vertex once (two crossings for a convex card)', () => {
    const card = [pt(0, 90), pt(0.3, 90), pt(1, 30), pt(1, 0), pt(0.1, 0), pt(0, 20)];
    const at = outlineCrossingsPsig(card, 0.3);
    expect(at).toHaveLength(2);
    expect(Math.max(...at)).toBe(90);
    // Lower line between (0.1, 0) and (1, 0): 0 psig.
    expect(Math.min(...at)).toBeCloseTo(0, 12);
  });

  it('a compression hook: the lower line rises towards the admission end', () => {
    // Exhaust at 2 psig back to 0.2 of the stroke, then compression rising to 30 psig at the end.
    const card = [pt(0, 120), pt(0.4, 110), pt(1, 20), pt(1, 2), pt(0.2, 2), pt(0, 30)];
    expect(lowerLinePressurePsig(card, 0.1)).toBeCloseTo(16, 12); // halfway from 2 to 30
    expect(lowerLinePressurePsig(card, 0.5)).toBeCloseTo(2, 12);
  });

  it('misses the card outside its length', () => {
    expect(upperLinePressurePsig(trapezoid, 1.2)).toBeNull();
    expect(lowerLinePressurePsig(trapezoid, -0.1)).toBeNull();
  });

  it('highest pressure is the top of the admission line, below-atmosphere points included', () => {
    expect(highestPressurePsig([pt(0, 22), pt(0.5, 10), pt(1, -8), pt(0, -11)])).toBe(22);
  });

  it('refuses an outline of fewer than three points or with a missing number', () => {
    expect(() => upperLinePressurePsig([pt(0, 1), pt(1, 1)], 0.5)).toThrow(RangeError);
    expect(() => highestPressurePsig([pt(0, 1), pt(1, Number.NaN), pt(0, 0)])).toThrow(RangeError);
  });
});
