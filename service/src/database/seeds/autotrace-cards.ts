/**
 * Test cards for the automatic tracer: known outlines drawn as photographs with the faults a phone
 * photo of a card shows (a turned card, uneven light and a shadow at one edge, noise, blur, JPEG
 * compression, a pen line of varying darkness). Used by the tracer's tests and by the benchmark.
 */
import jpeg from 'jpeg-js';
import { blur2 } from 'd3-array';
import { idealCardPoints } from '../../calculations/ideal-card.js';
import { shoelaceArea } from '../../calculations/indicator-card.js';
import { psiaToPsig } from '../../calculations/units.js';
import { Canvas, prng, realisticOutline, type Rgb } from './card-image.js';

export interface OutlinePoint {
  strokeFraction: number;
  pressurePsig: number;
}

export interface TestCardSpec {
  name: string;
  /** The diagram(s), card coordinates: stroke fraction across, psi gauge up. */
  outlines: OutlinePoint[][];
  springPsiPerIn: number;
  lengthIn: number;
  tiltDeg: number;
  /** Light falling off across the card (0 even … 0.5 half as bright at the far side). */
  unevenLight: number;
  /** A shadow over one edge of the card. */
  shadow: boolean;
  /** Standard deviation of the sensor noise, grey levels. */
  noise: number;
  /** Blur radius, pixels (0 none). */
  blurPx: number;
  /** JPEG quality (0 keeps the picture lossless). */
  jpegQuality: number;
  /** Draw the atmospheric line. */
  atmosphericLine?: boolean;
  /** A printed frame round the card, 0.15 in inside its edge. */
  printedBorder?: boolean;
  /** A printed grid of faint lines every quarter inch. */
  grid?: boolean;
  pixelsPerInch?: number;
}

export interface TestCard {
  spec: TestCardSpec;
  /** RGBA pixels as a decoder or a canvas gives them. */
  data: Uint8Array;
  width: number;
  height: number;
  /** The JPEG file when the card was compressed. */
  jpeg: Buffer | null;
  /** The true mean effective pressure of the (first) diagram, psi: net area over length. */
  meanEffectivePressurePsi: number;
}

/** Net mean effective pressure of an outline (psi): its area in (stroke fraction × psi), loops subtracting. */
export function outlineMepPsi(outline: readonly OutlinePoint[]): number {
  return shoelaceArea(outline.map((p) => ({ x: p.strokeFraction, y: p.pressurePsig })));
}

/** An outline from its forward (steam) line and its return (exhaust) line, each as a function of stroke fraction. */
function fromLines(upper: (x: number) => number, lower: (x: number) => number): OutlinePoint[] {
  const out: OutlinePoint[] = [];
  const n = 120;
  for (let i = 0; i <= n; i++) out.push({ strokeFraction: i / n, pressurePsig: upper(i / n) });
  for (let i = n; i >= 0; i--) out.push({ strokeFraction: i / n, pressurePsig: lower(i / n) });
  return out;
}

const smooth = (t: number) => {
  const u = Math.max(0, Math.min(1, t));
  return u * u * (3 - 2 * u);
};

/** The outlines of the test set (card coordinates) with the spring each is drawn with. */
export function testOutlines(): { name: string; outline: OutlinePoint[]; springPsiPerIn: number }[] {
  const ideal = (clearanceFraction: number) =>
    idealCardPoints({ admissionPressurePsia: 114.7, cutoffFraction: 0.3, backPressurePsia: 19.7, clearanceFraction, expansionSegments: 48 })
      .slice(0, -1)
      .map((p) => ({ strokeFraction: p.strokeFraction, pressurePsig: psiaToPsig(p.pressurePsia) }));
  const wireDrawn = realisticOutline({
    seed: 'wire',
    end: 'head',
    admissionPressurePsia: 114.7,
    backPressurePsia: 22,
    cutOffFraction: 0.35,
    clearanceFraction: 0.07,
    springPsiPerIn: 60,
    lengthIn: 3.5,
    wireDrawing: 0.2,
  });
  // A compound engine's low-pressure card: from the receiver down into the vacuum; the expansion line
  // falls below the exhaust line at the toe, which makes a loop of negative work.
  const lpLoop = fromLines(
    (x) => {
      const steam = 12 - 4 * x;
      const expansion = (8 * 0.45 + 14.7 * 0.45) / (x + 0.05) - 14.7;
      return x < 0.4 ? steam : Math.min(steam, expansion) - 2.5 * smooth((x - 0.8) / 0.2);
    },
    (x) => -10.5 + 1.5 * x + 13 * Math.max(0, 0.08 - x) * 10,
  );
  // A high-pressure card expanded below the receiver pressure: a negative loop at the toe.
  const hpToeLoop = fromLines(
    (x) => (x < 0.25 ? 95 - 10 * x : (92.5 + 14.7) * (0.3 / (x + 0.05)) - 14.7 - 6 * smooth((x - 0.85) / 0.15)),
    (x) => 12 + 2 * x + 120 * Math.max(0, 0.1 - x) ** 2 * 30,
  );
  return [
    { name: 'ideal, no clearance', outline: ideal(0), springPsiPerIn: 60 },
    { name: 'ideal, 8 % clearance', outline: ideal(0.08), springPsiPerIn: 60 },
    { name: 'wire-drawn admission', outline: wireDrawn, springPsiPerIn: 60 },
    { name: 'compound LP with a loop', outline: lpLoop, springPsiPerIn: 16 },
    { name: 'negative loop at the toe', outline: hpToeLoop, springPsiPerIn: 60 },
  ];
}

/** The test set: every outline under several photographic conditions, turned up to ±8°. */
export function testCardSpecs(): TestCardSpec[] {
  const conditions: Omit<TestCardSpec, 'name' | 'outlines' | 'springPsiPerIn' | 'lengthIn'>[] = [
    { tiltDeg: 0, unevenLight: 0, shadow: false, noise: 0, blurPx: 0, jpegQuality: 0 },
    { tiltDeg: 8, unevenLight: 0.35, shadow: false, noise: 4, blurPx: 0, jpegQuality: 0 },
    { tiltDeg: -8, unevenLight: 0.2, shadow: true, noise: 6, blurPx: 1, jpegQuality: 0 },
    { tiltDeg: 4.5, unevenLight: 0.3, shadow: true, noise: 5, blurPx: 1, jpegQuality: 70 },
    { tiltDeg: -3, unevenLight: 0.4, shadow: false, noise: 8, blurPx: 1.5, jpegQuality: 55 },
  ];
  const specs: TestCardSpec[] = [];
  for (const o of testOutlines())
    for (const [i, c] of conditions.entries())
      specs.push({ ...c, name: `${o.name} #${i + 1}`, outlines: [o.outline], springPsiPerIn: o.springPsiPerIn, lengthIn: 3.5 });
  return specs;
}

/** Draws a test card as a photograph. */
export function drawTestCard(spec: TestCardSpec): TestCard {
  const rnd = prng(spec.name);
  const ppi = spec.pixelsPerInch ?? 120;
  const tilt = (spec.tiltDeg * Math.PI) / 180;
  const all = spec.outlines.flat();
  const maxPsig = Math.max(0, ...all.map((p) => p.pressurePsig));
  const minPsig = Math.min(0, ...all.map((p) => p.pressurePsig));
  const diagrams = Math.max(1, spec.outlines.length);
  const diagramLengthIn = spec.lengthIn / diagrams;
  const cardW = spec.lengthIn + 1.2;
  const aboveIn = maxPsig / spec.springPsiPerIn + 0.5;
  const cardH = aboveIn + -minPsig / spec.springPsiPerIn + 0.5;
  const border = 0.45;
  const width = Math.round((cardW + 2 * border) * ppi);
  const height = Math.round((cardH + 2 * border) * ppi);
  const cx = width / 2;
  const cy = height / 2;
  const cos = Math.cos(tilt);
  const sin = Math.sin(tilt);
  const toImage = (xIn: number, yIn: number) => {
    const x = (border + xIn) * ppi - cx;
    const y = (border + yIn) * ppi - cy;
    return { x: cx + x * cos - y * sin, y: cy + x * sin + y * cos };
  };
  const inCard = (px: number, py: number) => {
    const x = px - cx;
    const y = py - cy;
    const xIn = (cx + x * cos + y * sin) / ppi - border;
    const yIn = (cy - x * sin + y * cos) / ppi - border;
    return xIn >= 0 && xIn <= cardW && yIn >= 0 && yIn <= cardH;
  };
  const canvas = new Canvas(width, height, (x, y) => (inCard(x + 0.5, y + 0.5) ? [236, 231, 216] : [64, 60, 55]));
  const left = 0.6;
  if (spec.grid)
    for (let g = 0.25; g < Math.max(cardW, cardH); g += 0.25) {
      if (g < cardW) canvas.polyline([toImage(g, 0.05), toImage(g, cardH - 0.05)], 1, [196, 188, 170]);
      if (g < cardH) canvas.polyline([toImage(0.05, g), toImage(cardW - 0.05, g)], 1, [196, 188, 170]);
    }
  if (spec.printedBorder) {
    const m = 0.15;
    const frame = [toImage(m, m), toImage(cardW - m, m), toImage(cardW - m, cardH - m), toImage(m, cardH - m)];
    canvas.polyline(frame, 1.4, [90, 84, 78], true);
  }
  if (spec.atmosphericLine !== false)
    canvas.polyline([toImage(left - 0.25, aboveIn), toImage(left + spec.lengthIn + 0.25, aboveIn)], 1.6, [60, 62, 70]);
  spec.outlines.forEach((outline, d) => {
    const x0 = left + d * diagramLengthIn + (diagrams > 1 ? 0.1 : 0);
    const len = diagrams > 1 ? diagramLengthIn - 0.2 : diagramLengthIn;
    const pts = outline.map((p) => toImage(x0 + p.strokeFraction * len, aboveIn - p.pressurePsig / spec.springPsiPerIn));
    // A pencil line of varying darkness: the outline drawn in four parts, each a little different.
    const parts = 4;
    const per = Math.ceil(pts.length / parts);
    for (let k = 0; k < parts; k++) {
      const part = pts.slice(k * per, Math.min(pts.length, (k + 1) * per + 1));
      if (k === parts - 1) part.push(pts[0]);
      const tone = Math.round(40 + 60 * rnd());
      const colour: Rgb = [tone, tone + 2, tone + 12];
      canvas.polyline(part, 2.2, colour);
    }
  });

  // Light, shadow, blur, noise.
  const grid = (c: number) => Float64Array.from({ length: width * height }, (_, i) => canvas.px[i * 3 + c]);
  const channels = [grid(0), grid(1), grid(2)];
  if (spec.blurPx > 0) for (const ch of channels) blur2({ data: ch, width, height }, spec.blurPx);
  const angle = rnd() * Math.PI * 2;
  const data = new Uint8Array(width * height * 4);
  for (let y = 0; y < height; y++)
    for (let x = 0; x < width; x++) {
      const i = y * width + x;
      const u = ((x - cx) * Math.cos(angle) + (y - cy) * Math.sin(angle)) / Math.max(width, height) + 0.5;
      let light = 1 - spec.unevenLight * u;
      if (spec.shadow) light *= 0.55 + 0.45 * smooth((x - width * 0.05) / (width * 0.2));
      const grain = spec.noise > 0 ? spec.noise * (rnd() + rnd() + rnd() - 1.5) * 2 : 0;
      for (let c = 0; c < 3; c++) data[i * 4 + c] = Math.max(0, Math.min(255, Math.round(channels[c][i] * light + grain)));
      data[i * 4 + 3] = 255;
    }
  const truth = spec.outlines.length > 0 ? outlineMepPsi(spec.outlines[0]) : 0;
  if (spec.jpegQuality > 0) {
    const file = jpeg.encode({ data, width, height }, spec.jpegQuality).data;
    const decoded = jpeg.decode(file, { useTArray: true, formatAsRGBA: true });
    return { spec, data: decoded.data, width, height, jpeg: Buffer.from(file), meanEffectivePressurePsi: truth };
  }
  return { spec, data, width, height, jpeg: null, meanEffectivePressurePsi: truth };
}
