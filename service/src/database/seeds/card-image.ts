/**
 * Draws demonstration indicator-card images for the invented engine: an ideal card (ideal-card.ts)
 * given the distortions a real card shows — the admission line falling with wire-drawing, a rounded
 * cut-off corner, release before the end of the stroke, a compression hook and the pen's slight
 * wander — photographed a little askew on a bench. The picture is written as a PNG by a small encoder
 * of our own (node:zlib deflate), so no image library is needed.
 *
 * With the picture comes the trace a careful person would make on it (calibration marks and outline
 * points in image pixels), so the demo can show a traced card.
 */
import { deflateSync } from 'node:zlib';
import { createHash } from 'node:crypto';
import type { CardTrace, CylinderEnd, TracePoint } from '@crankjournal/shared-types';
import { idealCardPoints } from '../../calculations/ideal-card.js';
import { psiaToPsig } from '../../calculations/units.js';

// ---------------------------------------------------------------------------------------------
// PNG encoder (8-bit RGB, one IDAT chunk)
// ---------------------------------------------------------------------------------------------

const CRC_TABLE = (() => {
  const t = new Uint32Array(256);
  for (let n = 0; n < 256; n++) {
    let c = n;
    for (let k = 0; k < 8; k++) c = c & 1 ? 0xedb88320 ^ (c >>> 1) : c >>> 1;
    t[n] = c >>> 0;
  }
  return t;
})();

function crc32(buf: Buffer): number {
  let c = 0xffffffff;
  for (let i = 0; i < buf.length; i++) c = CRC_TABLE[(c ^ buf[i]) & 0xff] ^ (c >>> 8);
  return (c ^ 0xffffffff) >>> 0;
}

function chunk(type: string, data: Buffer): Buffer {
  const length = Buffer.alloc(4);
  length.writeUInt32BE(data.length);
  const body = Buffer.concat([Buffer.from(type, 'latin1'), data]);
  const crc = Buffer.alloc(4);
  crc.writeUInt32BE(crc32(body));
  return Buffer.concat([length, body, crc]);
}

/** Encodes 8-bit RGB pixels (row by row, 3 bytes a pixel) as a PNG file. */
export function encodePng(widthPx: number, heightPx: number, rgb: Uint8Array): Buffer {
  if (rgb.length !== widthPx * heightPx * 3) throw new RangeError('rgb must hold width × height × 3 bytes');
  const stride = widthPx * 3;
  const raw = Buffer.alloc((stride + 1) * heightPx);
  for (let y = 0; y < heightPx; y++) {
    // Filter "Up" (2): each byte less the byte above it; smooth paper compresses well.
    const row = y * (stride + 1);
    raw[row] = 2;
    for (let i = 0; i < stride; i++) {
      const above = y > 0 ? rgb[(y - 1) * stride + i] : 0;
      raw[row + 1 + i] = (rgb[y * stride + i] - above) & 0xff;
    }
  }
  const ihdr = Buffer.alloc(13);
  ihdr.writeUInt32BE(widthPx, 0);
  ihdr.writeUInt32BE(heightPx, 4);
  ihdr[8] = 8; // bit depth
  ihdr[9] = 2; // colour type: RGB
  ihdr[10] = 0;
  ihdr[11] = 0;
  ihdr[12] = 0;
  return Buffer.concat([
    Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]),
    chunk('IHDR', ihdr),
    chunk('IDAT', deflateSync(raw, { level: 9 })),
    chunk('IEND', Buffer.alloc(0)),
  ]);
}

// ---------------------------------------------------------------------------------------------
// A small canvas
// ---------------------------------------------------------------------------------------------

export type Rgb = [number, number, number];

export class Canvas {
  readonly px: Uint8Array;
  constructor(
    readonly width: number,
    readonly height: number,
    fill: (x: number, y: number) => Rgb,
  ) {
    this.px = new Uint8Array(width * height * 3);
    for (let y = 0; y < height; y++)
      for (let x = 0; x < width; x++) {
        const [r, g, b] = fill(x, y);
        const i = (y * width + x) * 3;
        this.px[i] = r;
        this.px[i + 1] = g;
        this.px[i + 2] = b;
      }
  }

  /** Lays ink over the pixel with coverage `alpha` (0..1). */
  private ink(x: number, y: number, colour: Rgb, alpha: number) {
    if (x < 0 || y < 0 || x >= this.width || y >= this.height || alpha <= 0) return;
    const i = (y * this.width + x) * 3;
    for (let c = 0; c < 3; c++) this.px[i + c] = Math.round(this.px[i + c] * (1 - alpha) + colour[c] * alpha);
  }

  /** An anti-aliased polyline of the given width (pixels); the ink at each pixel is the closest segment's. */
  polyline(points: readonly TracePoint[], widthPx: number, colour: Rgb, closed = false) {
    const segs: [TracePoint, TracePoint][] = [];
    for (let i = 0; i + 1 < points.length; i++) segs.push([points[i], points[i + 1]]);
    if (closed && points.length > 2) segs.push([points[points.length - 1], points[0]]);
    const half = widthPx / 2;
    const coverage = new Map<number, number>();
    for (const [a, b] of segs) {
      const x0 = Math.floor(Math.min(a.x, b.x) - half - 1);
      const x1 = Math.ceil(Math.max(a.x, b.x) + half + 1);
      const y0 = Math.floor(Math.min(a.y, b.y) - half - 1);
      const y1 = Math.ceil(Math.max(a.y, b.y) + half + 1);
      const dx = b.x - a.x;
      const dy = b.y - a.y;
      const len2 = dx * dx + dy * dy || 1e-9;
      for (let y = y0; y <= y1; y++)
        for (let x = x0; x <= x1; x++) {
          const px = x + 0.5;
          const py = y + 0.5;
          const t = Math.max(0, Math.min(1, ((px - a.x) * dx + (py - a.y) * dy) / len2));
          const d = Math.hypot(px - (a.x + t * dx), py - (a.y + t * dy));
          const alpha = Math.max(0, Math.min(1, half + 0.5 - d));
          if (alpha <= 0) continue;
          const key = y * this.width + x;
          coverage.set(key, Math.max(coverage.get(key) ?? 0, alpha));
        }
    }
    for (const [key, alpha] of coverage) this.ink(key % this.width, Math.floor(key / this.width), colour, alpha * 0.92);
  }
}

// ---------------------------------------------------------------------------------------------
// The card
// ---------------------------------------------------------------------------------------------

/** A small deterministic generator, so a drawing is the same on every machine. */
export function prng(seed: string): () => number {
  let h = createHash('sha256').update(seed).digest().readUInt32LE(0) || 1;
  return () => {
    h ^= h << 13;
    h ^= h >>> 17;
    h ^= h << 5;
    return ((h >>> 0) % 1_000_000) / 1_000_000;
  };
}

const smoothstep = (t: number) => {
  const u = Math.max(0, Math.min(1, t));
  return u * u * (3 - 2 * u);
};

export interface CardDrawingSpec {
  /** Seed for the pen's wander and the paper; the same seed draws the same card. */
  seed: string;
  /** Head-end cards admit at the left of the card, crank-end cards at the right. */
  end: CylinderEnd;
  /** Pressure in the steam chest (throttle or receiver), psia. */
  admissionPressurePsia: number;
  /** Exhaust pressure (receiver or condenser), psia. */
  backPressurePsia: number;
  cutOffFraction: number;
  clearanceFraction: number;
  springPsiPerIn: number;
  lengthIn: number;
  /** Fall of the admission line by cut-off, as a fraction of (admission − back pressure). */
  wireDrawing?: number;
  /** Where compression begins, fraction of the stroke from the admission end. */
  compressionFraction?: number;
  /** Where release begins, fraction of the stroke. */
  releaseFraction?: number;
  /** Height of the compression hook, as a fraction of (admission − back pressure). */
  compressionHook?: number;
  pixelsPerInch?: number;
  /** How askew the card lies in the photograph, degrees. */
  tiltDeg?: number;
}

export interface DrawnCard {
  png: Buffer;
  widthPx: number;
  heightPx: number;
  /** The trace a careful person would make on this picture. */
  trace: CardTrace;
  /** The drawn outline in card coordinates (stroke fraction, psig), for checking the trace. */
  outline: { strokeFraction: number; pressurePsig: number }[];
}

/** The outline of a real-looking card in card coordinates: stroke fraction across, psi gauge up. */
export function realisticOutline(spec: CardDrawingSpec): { strokeFraction: number; pressurePsig: number }[] {
  const p1 = spec.admissionPressurePsia;
  const pb = spec.backPressurePsia;
  const k = spec.cutOffFraction;
  const span = p1 - pb;
  const wire = spec.wireDrawing ?? 0.06;
  const xr = spec.releaseFraction ?? 0.93;
  const xc = spec.compressionFraction ?? 0.12;
  const hook = spec.compressionHook ?? 0.22;

  // The ideal card (hyperbolic expansion) is the frame the distortions are laid on.
  const ideal = idealCardPoints({
    admissionPressurePsia: p1,
    cutoffFraction: k,
    backPressurePsia: pb,
    clearanceFraction: spec.clearanceFraction,
    expansionSegments: 64,
  });
  const expansion = ideal
    .filter((p, i) => i > 0 && p.strokeFraction >= k && p.pressurePsia > pb)
    .sort((a, b) => a.strokeFraction - b.strokeFraction);
  const idealUpper = (x: number): number => {
    if (x <= k) return p1;
    for (let i = 0; i + 1 < expansion.length; i++) {
      const a = expansion[i];
      const b = expansion[i + 1];
      if (x >= a.strokeFraction && x <= b.strokeFraction)
        return a.pressurePsia + ((x - a.strokeFraction) / (b.strokeFraction - a.strokeFraction)) * (b.pressurePsia - a.pressurePsia);
    }
    return expansion[expansion.length - 1].pressurePsia;
  };
  // Steam line: admission falling with wire-drawing, the valve closing over a little travel, then expansion.
  const pCut = p1 - wire * span;
  const admissionLine = (x: number) => p1 - wire * span * (x / k);
  const expansionLine = (x: number) => idealUpper(x) * (pCut / p1);
  const blend = 0.07;
  const steamLine = (x: number) => {
    const s = smoothstep((x - (k - blend)) / (2 * blend));
    return admissionLine(Math.min(x, k)) * (1 - s) + expansionLine(Math.max(x, k)) * s;
  };
  // Release: the exhaust opens before the end of the stroke; the toe of the card finishes on the return.
  const toe = pb + 0.45 * (steamLine(1) - pb);
  const upper = (x: number) => {
    if (x <= xr) return steamLine(x);
    const s = smoothstep((x - xr) / (1 - xr));
    return steamLine(x) * (1 - s) + toe * s;
  };
  const backRise = 0.015 * span;
  const lower = (x: number) => {
    // From the toe down to the exhaust line over the first part of the return stroke.
    const exhaust = pb + backRise * x;
    const fromToe = smoothstep((1 - x) / 0.1);
    let p = toe * (1 - fromToe) + exhaust * fromToe;
    // Compression hook as the exhaust valve closes near the end of the return stroke.
    if (x < xc) p += hook * span * ((xc - x) / xc) ** 2;
    return p;
  };

  const out: { strokeFraction: number; pressurePsia: number }[] = [];
  const N = 160;
  for (let i = 0; i <= N; i++) {
    const x = 0.004 + (0.996 * i) / N;
    out.push({ strokeFraction: x, pressurePsia: upper(x) });
  }
  for (let i = N; i >= 0; i--) {
    const x = (1 * i) / N;
    out.push({ strokeFraction: x, pressurePsia: lower(x) });
  }
  // The admission edge: a steep rise from the top of the hook to full pressure, with a little lead.
  const top = lower(0);
  for (let i = 1; i < 8; i++) {
    const t = i / 8;
    out.push({ strokeFraction: 0.004 * t * t, pressurePsia: top + (upper(0.004) - top) * t });
  }
  return out.map((p) => ({ strokeFraction: p.strokeFraction, pressurePsig: psiaToPsig(p.pressurePsia) }));
}

/** Gaussian smoothing of a closed polyline after resampling it at even spacing (rounds the corners as a pen would). */
function smoothClosed(points: TracePoint[], spacingPx: number, sigmaPx: number): TracePoint[] {
  const resampled: TracePoint[] = [];
  const n = points.length;
  let carry = 0;
  for (let i = 0; i < n; i++) {
    const a = points[i];
    const b = points[(i + 1) % n];
    const len = Math.hypot(b.x - a.x, b.y - a.y);
    let d = carry;
    while (d < len) {
      const t = d / len;
      resampled.push({ x: a.x + t * (b.x - a.x), y: a.y + t * (b.y - a.y) });
      d += spacingPx;
    }
    carry = d - len;
  }
  const m = resampled.length;
  const half = Math.ceil((3 * sigmaPx) / spacingPx);
  const weights = Array.from({ length: 2 * half + 1 }, (_, j) => Math.exp(-(((j - half) * spacingPx) ** 2) / (2 * sigmaPx * sigmaPx)));
  const wsum = weights.reduce((a, b) => a + b, 0);
  return resampled.map((_, i) => {
    let x = 0;
    let y = 0;
    for (let j = -half; j <= half; j++) {
      const p = resampled[(i + j + m) % m];
      x += p.x * weights[j + half];
      y += p.y * weights[j + half];
    }
    return { x: x / wsum, y: y / wsum };
  });
}

/** Draws the card as a PNG photograph and makes the trace of it. */
export function drawIndicatorCard(spec: CardDrawingSpec): DrawnCard {
  const rnd = prng(spec.seed);
  const ppi = spec.pixelsPerInch ?? 140;
  const tilt = ((spec.tiltDeg ?? (rnd() - 0.5) * 2.4) * Math.PI) / 180;
  const outline = realisticOutline(spec);

  const maxPsig = Math.max(...outline.map((p) => p.pressurePsig));
  const minPsig = Math.min(0, ...outline.map((p) => p.pressurePsig));
  const cardW = spec.lengthIn + 1.0;
  const aboveIn = maxPsig / spec.springPsiPerIn + 0.45;
  const belowIn = -minPsig / spec.springPsiPerIn + 0.4;
  const cardH = aboveIn + belowIn;
  const border = 0.35;
  const width = Math.round((cardW + 2 * border) * ppi);
  const height = Math.round((cardH + 2 * border) * ppi);
  const centre = { x: width / 2, y: height / 2 };

  // Card coordinates (inches from the card's top-left corner) → image pixels, turned by the tilt.
  const cos = Math.cos(tilt);
  const sin = Math.sin(tilt);
  const toImage = (xIn: number, yIn: number): TracePoint => {
    const x = (border + xIn) * ppi - centre.x;
    const y = (border + yIn) * ppi - centre.y;
    return { x: centre.x + x * cos - y * sin, y: centre.y + x * sin + y * cos };
  };
  const fromImage = (p: TracePoint): { xIn: number; yIn: number } => {
    const x = p.x - centre.x;
    const y = p.y - centre.y;
    return { xIn: (centre.x + x * cos + y * sin) / ppi - border, yIn: (centre.y - x * sin + y * cos) / ppi - border };
  };
  const left = 0.5;
  const atmY = aboveIn;
  const cardPoint = (strokeFraction: number, pressurePsig: number) => {
    const along = spec.end === 'head' ? strokeFraction : 1 - strokeFraction;
    return toImage(left + along * spec.lengthIn, atmY - pressurePsig / spec.springPsiPerIn);
  };

  // Paper on a dark bench, a little uneven in tone, with a few specks.
  const specks = new Set<number>();
  for (let i = 0; i < (width * height) / 900; i++) specks.add(Math.floor(rnd() * width * height));
  const shadeA = rnd() * Math.PI * 2;
  const canvas = new Canvas(width, height, (x, y) => {
    const c = fromImage({ x: x + 0.5, y: y + 0.5 });
    const inside = c.xIn >= 0 && c.xIn <= cardW && c.yIn >= 0 && c.yIn <= cardH;
    if (!inside) {
      const v = 58 + ((x * 7 + y * 13) % 5);
      return [v, v - 4, v - 9];
    }
    const shade = 6 * Math.sin(shadeA + (x / width) * 2.2) * Math.cos((y / height) * 1.7);
    const speck = specks.has(y * width + x) ? -38 : 0;
    return [Math.round(234 + shade + speck), Math.round(228 + shade + speck), Math.round(212 + shade + speck)];
  });

  // The atmospheric line, drawn with the cock shut, a little longer than the diagram.
  const atmA = toImage(left - 0.2, atmY);
  const atmB = toImage(left + spec.lengthIn + 0.2, atmY);
  canvas.polyline([atmA, atmB], 1.7, [52, 54, 66]);

  // The diagram: pen wander, then rounded by the pen and linkage.
  const phase = [rnd(), rnd(), rnd()].map((r) => r * Math.PI * 2);
  const wander = (t: number) => 0.6 * Math.sin(t * 9 + phase[0]) + 0.35 * Math.sin(t * 23 + phase[1]) + 0.2 * Math.sin(t * 51 + phase[2]);
  const raw = outline.map((p, i) => {
    const q = cardPoint(p.strokeFraction, p.pressurePsig);
    return { x: q.x, y: q.y + wander(i / outline.length) };
  });
  const drawn = smoothClosed(raw, 1.5, 2.8);
  canvas.polyline(drawn, 2.3, [38, 40, 58], true);

  // The trace a careful person makes: calibration marks on the atmospheric line and the diagram's
  // ends, then points around the outline, closer together where it bends.
  const jitter = () => (rnd() - 0.5) * 1.2;
  const markA = toImage(left - 0.1, atmY);
  const markB = toImage(left + spec.lengthIn + 0.1, atmY);
  const admissionEnd = cardPoint(0, 0);
  const releaseEnd = cardPoint(1, 0);
  const turning: number[] = drawn.map((p, i) => {
    const a = drawn[(i - 6 + drawn.length) % drawn.length];
    const b = drawn[(i + 6) % drawn.length];
    const v1 = { x: p.x - a.x, y: p.y - a.y };
    const v2 = { x: b.x - p.x, y: b.y - p.y };
    const angle = Math.abs(Math.atan2(v1.x * v2.y - v1.y * v2.x, v1.x * v2.x + v1.y * v2.y));
    return 1 + 10 * angle;
  });
  const totalWeight = turning.reduce((a, b) => a + b, 0);
  const clicks = 44;
  const pointsPx: TracePoint[] = [];
  let acc = 0;
  let next = 0;
  for (let i = 0; i < drawn.length && pointsPx.length < clicks; i++) {
    acc += turning[i];
    if (acc >= next) {
      pointsPx.push({ x: +(drawn[i].x + jitter()).toFixed(1), y: +(drawn[i].y + jitter()).toFixed(1) });
      next += totalWeight / clicks;
    }
  }
  const round = (p: TracePoint): TracePoint => ({ x: +p.x.toFixed(1), y: +p.y.toFixed(1) });
  return {
    png: encodePng(width, height, canvas.px),
    widthPx: width,
    heightPx: height,
    trace: {
      atmosphericLine: [round(markA), round(markB)],
      admissionEndPx: round(admissionEnd),
      releaseEndPx: round(releaseEnd),
      pointsPx,
    },
    outline,
  };
}
