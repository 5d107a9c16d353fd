import { inflateSync } from 'node:zlib';
import { calibrateTrace, shoelaceArea } from '../../calculations/indicator-card.js';
import { idealMeanEffectivePressurePsi } from '../../calculations/ideal-card.js';
import { psigToPsia } from '../../calculations/units.js';
import { drawIndicatorCard, encodePng, realisticOutline, type CardDrawingSpec } from './card-image.js';

/** Reads a PNG's chunks (W3C PNG Specification, 2nd ed., section 5.3: length, type, data, CRC). */
function chunks(png: Buffer): { type: string; data: Buffer; crc: number }[] {
  const out = [];
  let i = 8;
  while (i < png.length) {
    const length = png.readUInt32BE(i);
    out.push({
      type: png.toString('latin1', i + 4, i + 8),
      data: png.subarray(i + 8, i + 8 + length),
      crc: png.readUInt32BE(i + 8 + length),
    });
    i += 12 + length;
  }
  return out;
}

describe('our PNG encoder', () => {
  it(
    'writes the signature, IHDR, IDAT and IEND; IEND’s CRC is AE 42 60 82 (W3C PNG Specification, 2nd ed., sections ' +
      '5.2, 5.6 and 11.2.5)',
    () => {
      const png = encodePng(2, 2, new Uint8Array([255, 0, 0, 0, 255, 0, 0, 0, 255, 10, 20, 30]));
      expect([...png.subarray(0, 8)]).toEqual([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]);
      const c = chunks(png);
      expect(c.map((x) => x.type)).toEqual(['IHDR', 'IDAT', 'IEND']);
      expect(c[2].crc).toBe(0xae426082);
      expect(c[0].data.readUInt32BE(0)).toBe(2);
      expect(c[0].data[9]).toBe(2); // colour type 2: truecolour
    },
  );

  it('the image data inflates back to the pixels under the "Up" filter (section 9.2: Up(x) + Prior(x))', () => {
    const rgb = new Uint8Array([255, 0, 0, 0, 255, 0, 0, 0, 255, 10, 20, 30]);
    const raw = inflateSync(chunks(encodePng(2, 2, rgb)).find((x) => x.type === 'IDAT')!.data);
    const rows = [raw.subarray(0, 7), raw.subarray(7, 14)];
    expect(rows.every((r) => r[0] === 2)).toBe(true);
    const first = [...rows[0].subarray(1)];
    const second = [...rows[1].subarray(1)].map((v, i) => (v + first[i]) & 0xff);
    expect([...first, ...second]).toEqual([...rgb]);
  });
});

describe('drawn demonstration cards and their traces', () => {
  const hpHead: CardDrawingSpec = {
    seed: 'spec-hp-head',
    end: 'head',
    admissionPressurePsia: psigToPsia(126),
    backPressurePsia: psigToPsia(28.5),
    cutOffFraction: 0.35,
    clearanceFraction: 0.08,
    springPsiPerIn: 80,
    lengthIn: 3.5,
  };
  const lpCrank: CardDrawingSpec = {
    ...hpHead,
    seed: 'spec-lp-crank',
    end: 'crank',
    admissionPressurePsia: psigToPsia(24.5),
    backPressurePsia: 3.3,
    springPsiPerIn: 20,
    cutOffFraction: 0.42,
  };

  it.each([
    ['HP head end', hpHead],
    ['LP crank end (mirrored, partly below the atmospheric line)', lpCrank],
  ])(
    '%s: the trace’s MEP is within 1.5 %% of the drawn outline’s, and below the ideal card’s (a real card is never fuller than the ideal)',
    (_, spec) => {
      const drawn = drawIndicatorCard(spec);
      const calibrated = calibrateTrace({
        atmosphericLine: drawn.trace.atmosphericLine,
        diagramStartPx: drawn.trace.admissionEndPx,
        diagramEndPx: drawn.trace.releaseEndPx,
        tracePx: drawn.trace.pointsPx,
        springPsiPerIn: spec.springPsiPerIn,
        cardLengthIn: spec.lengthIn,
      });
      const outlineArea = shoelaceArea(
        drawn.outline.map((p) => ({ x: p.strokeFraction * spec.lengthIn, y: p.pressurePsig / spec.springPsiPerIn })),
      );
      const drawnMep = (outlineArea / spec.lengthIn) * spec.springPsiPerIn;
      expect(Math.abs(calibrated.meanEffectivePressurePsi - drawnMep) / drawnMep).toBeLessThan(0.015);
      expect(drawnMep).toBeLessThan(
        idealMeanEffectivePressurePsi({
          admissionPressurePsia: spec.admissionPressurePsia,
          cutoffFraction: spec.cutOffFraction,
          backPressurePsia: spec.backPressurePsia,
        }),
      );
      // The card's length comes back from the calibration marks.
      expect(calibrated.lengthIn).toBeCloseTo(spec.lengthIn, 6);
    },
  );

  it('the trace survives being stored as JSON and read back: the same calibration', () => {
    const drawn = drawIndicatorCard(hpHead);
    const reloaded = JSON.parse(JSON.stringify(drawn.trace)) as typeof drawn.trace;
    const calibrate = (t: typeof drawn.trace) =>
      calibrateTrace({
        atmosphericLine: t.atmosphericLine,
        diagramStartPx: t.admissionEndPx,
        diagramEndPx: t.releaseEndPx,
        tracePx: t.pointsPx,
        springPsiPerIn: 80,
        cardLengthIn: 3.5,
      });
    expect(calibrate(reloaded)).toEqual(calibrate(drawn.trace));
  });

  it('is the same picture every time (deterministic), and a different seed draws a different one', () => {
    expect(drawIndicatorCard(hpHead).png.equals(drawIndicatorCard(hpHead).png)).toBe(true);
    expect(drawIndicatorCard({ ...hpHead, seed: 'other' }).png.equals(drawIndicatorCard(hpHead).png)).toBe(false);
  });

  it('the admission line falls with wire-drawing and the card has a compression hook', () => {
    const o = realisticOutline(hpHead);
    const top = o.filter((p) => p.strokeFraction < 0.3).map((p) => p.pressurePsig);
    expect(Math.max(...top)).toBeLessThan(126 + 1e-9);
    // On the return stroke near the admission end the lower line rises above the exhaust line.
    const lower = (x: number) => Math.min(...o.filter((p) => Math.abs(p.strokeFraction - x) < 0.01).map((p) => p.pressurePsig));
    expect(lower(0.02)).toBeGreaterThan(lower(0.5) + 5);
  });
});
