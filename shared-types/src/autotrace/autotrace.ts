/**
 * Proposes the trace of an indicator card from a photograph's pixels: the atmospheric line, the
 * diagram's closed outline (as a polygon along the middle of the pen's stroke) and a confidence.
 * Pure: no DOM, no I/O; the same code runs in the browser (canvas pixels) and in the service (a
 * decoded PNG/JPEG). Blurs come from d3-array, contours from d3-contour, simplification from
 * simplify-js; the rest (line vote, region filling, lobe signs) is written here.
 *
 * How it works, in order:
 *  1. Grey image, lightly smoothed; the paper's own brightness is estimated by a dilation (a max
 *     filter wider than a pen line) followed by a wide blur, so uneven light and a shadow at one
 *     edge flatten out. Ink darkness = how much darker a pixel is than the paper around it.
 *  2. The card is the bright part of the photo; ink is looked for only well inside it. The ink
 *     threshold follows the darkest ink found (adaptive), so a faint pencil line still counts.
 *  3. The atmospheric line: a Hough vote over ink pixels for lines within ±12° of horizontal; the
 *     strongest straight line wins, refined by a weighted least-squares fit over the longest
 *     unbroken run of ink near it. Its two ends are the ends of that run.
 *  4. The line is removed from the ink, except where the diagram crosses it (ink just above and
 *     just below the line bridges the gap), so a card whose lines cross the atmosphere stays closed.
 *  5. Paper reachable from outside the card is "outside"; paper left over is enclosed. Enclosed
 *     regions belong to the ink figure around them; the figure enclosing the most is the diagram.
 *     A second figure enclosing a comparable area means two diagrams (refused); none means none. A printed
 *     frame or grid is set aside (a figure that encloses the atmospheric line is the card's). When nothing is
 *     closed without the line, the exhaust may run along it (exhausting at atmospheric pressure): then the
 *     line is kept, and the figure of the line and the diagram, reaching no further than the line, is taken.
 *  6. Each enclosed region (lobe) gets the ink nearest to it. A field of 1 in the lobe, ½ on its
 *     ink and 0 outside, blurred, crosses ½ along the middle of the stroke: that contour is the
 *     lobe's outline. Lobes that meet the largest lobe at a crossing run the other way (a loop of
 *     negative work), so their outlines are joined in with the opposite sense.
 */
import { blur2 } from 'd3-array';
import { contours } from 'd3-contour';
import { polygonArea } from 'd3-polygon';
import simplify from 'simplify-js';

export interface AutotracePoint {
  x: number;
  y: number;
}

export type AutotraceReasonCode =
  'too-small' | 'low-contrast' | 'glare' | 'no-atmospheric-line' | 'no-diagram' | 'not-closed' | 'two-diagrams' | 'several-loops';

export interface AutotraceReason {
  code: AutotraceReasonCode;
  message: string;
}

export interface AutotraceImage {
  /** RGBA bytes, row by row (as a canvas ImageData or a decoded PNG gives them). */
  data: Uint8Array | Uint8ClampedArray;
  width: number;
  height: number;
}

export interface AutotraceProposal {
  /** True when a trace is proposed; false when the card is refused (see reasons). */
  found: boolean;
  /** Two points on the atmospheric line (its ends as drawn), image pixels. */
  atmosphericLine: [AutotracePoint, AutotracePoint] | null;
  /** Where the diagram reaches furthest toward the admission end, and toward the release end. */
  admissionEndPx: AutotracePoint | null;
  releaseEndPx: AutotracePoint | null;
  /** The outline along the middle of the stroke, image pixels, closed implicitly. */
  pointsPx: AutotracePoint[];
  /** 0 (nothing to go on) to 1 (clean card). */
  confidence: number;
  /** Why the confidence is low, or why the card was refused. */
  reasons: AutotraceReason[];
  /** Number of enclosed loops in the diagram (2 or more for a card with a loop). */
  loops: number;
}

const MESSAGES: Record<AutotraceReasonCode, string> = {
  'too-small': 'The image is too small to find a diagram in (at least 120 × 80 pixels).',
  'low-contrast': 'Too little contrast between the pen line and the paper.',
  glare: 'Glare washes out part of the card; take the photo again without the reflection.',
  'no-atmospheric-line': 'No long straight atmospheric line was found below the diagram.',
  'no-diagram': 'No closed diagram was found on the card.',
  'not-closed': 'The diagram outline is not closed: a part of the pen line is missing or too faint.',
  'two-diagrams': 'Two closed curves of similar size were found: photograph one diagram per card.',
  'several-loops': 'The diagram has loops; check the proposed outline where its lines cross.',
};

const reason = (code: AutotraceReasonCode): AutotraceReason => ({ code, message: MESSAGES[code] });

function refused(reasons: AutotraceReasonCode[], atmosphericLine: [AutotracePoint, AutotracePoint] | null = null): AutotraceProposal {
  return {
    found: false,
    atmosphericLine,
    admissionEndPx: null,
    releaseEndPx: null,
    pointsPx: [],
    confidence: 0,
    reasons: reasons.map(reason),
    loops: 0,
  };
}

/** Max filter of radius r, separable (rows then columns). */
function maxFilter(src: Float32Array, w: number, h: number, r: number): Float32Array {
  const tmp = new Float32Array(w * h);
  const out = new Float32Array(w * h);
  for (let y = 0; y < h; y++) {
    const row = y * w;
    for (let x = 0; x < w; x++) {
      let m = 0;
      for (let k = Math.max(0, x - r); k <= Math.min(w - 1, x + r); k++) if (src[row + k] > m) m = src[row + k];
      tmp[row + x] = m;
    }
  }
  for (let x = 0; x < w; x++) {
    for (let y = 0; y < h; y++) {
      let m = 0;
      for (let k = Math.max(0, y - r); k <= Math.min(h - 1, y + r); k++) if (tmp[k * w + x] > m) m = tmp[k * w + x];
      out[y * w + x] = m;
    }
  }
  return out;
}

function percentile(values: Float32Array | number[], q: number): number {
  if (values.length === 0) return 0;
  const sorted = Float32Array.from(values).sort();
  return sorted[Math.min(sorted.length - 1, Math.max(0, Math.floor(q * (sorted.length - 1))))];
}

/** Labels connected pixels of a mask (8-connected when `eight`), returns labels (0 = none) and sizes. */
function label(mask: Uint8Array, w: number, h: number, eight: boolean): { labels: Int32Array; sizes: number[] } {
  const labels = new Int32Array(w * h);
  const sizes = [0];
  const stack = new Int32Array(w * h);
  let next = 0;
  for (let start = 0; start < w * h; start++) {
    if (!mask[start] || labels[start]) continue;
    next++;
    let top = 0;
    stack[top++] = start;
    labels[start] = next;
    let size = 0;
    while (top > 0) {
      const p = stack[--top];
      size++;
      const x = p % w;
      const y = (p - x) / w;
      for (let dy = -1; dy <= 1; dy++) {
        const yy = y + dy;
        if (yy < 0 || yy >= h) continue;
        for (let dx = -1; dx <= 1; dx++) {
          if (dx === 0 && dy === 0) continue;
          if (!eight && dx !== 0 && dy !== 0) continue;
          const xx = x + dx;
          if (xx < 0 || xx >= w) continue;
          const q = yy * w + xx;
          if (mask[q] && !labels[q]) {
            labels[q] = next;
            stack[top++] = q;
          }
        }
      }
    }
    sizes.push(size);
  }
  return { labels, sizes };
}

interface Line {
  /** A point on the line and its unit direction (left to right). */
  ox: number;
  oy: number;
  ex: number;
  ey: number;
  /** Extent of the drawn line along the direction from (ox, oy). */
  t0: number;
  t1: number;
  /** Half the drawn line's thickness, pixels. */
  halfWidth: number;
}

/**
 * The atmospheric line among the ink pixels: a Hough vote for near-horizontal lines, then for each
 * of the strongest few a weighted least-squares fit over its longest unbroken run of ink; the
 * longest straight run wins (the atmospheric line is drawn longer than the diagram).
 */
function findAtmosphericLine(ink: Uint8Array, dark: Float32Array, w: number, h: number): Line | null {
  const maxDeg = 12;
  const stepDeg = 0.2;
  const nA = Math.round((2 * maxDeg) / stepDeg) + 1;
  const diag = Math.ceil(Math.hypot(w, h));
  const nR = 2 * diag + 1;
  const acc = new Float32Array(nA * nR);
  const cosA = new Float32Array(nA);
  const sinA = new Float32Array(nA);
  for (let a = 0; a < nA; a++) {
    const th = ((-maxDeg + a * stepDeg) * Math.PI) / 180;
    // A line at angle th to the horizontal has normal (-sin th, cos th): rho = -x sin th + y cos th.
    cosA[a] = Math.cos(th);
    sinA[a] = Math.sin(th);
  }
  const xs: number[] = [];
  const ys: number[] = [];
  const vs: number[] = [];
  for (let p = 0; p < w * h; p++) {
    if (!ink[p]) continue;
    const x = p % w;
    const y = (p - x) / w;
    xs.push(x);
    ys.push(y);
    vs.push(dark[p]);
    for (let a = 0; a < nA; a++) acc[a * nR + Math.round(-x * sinA[a] + y * cosA[a]) + diag] += 1;
  }
  if (xs.length < 20) return null;
  // The strongest few peaks, each at least 3° or 10 px from the ones before.
  const peaks: { a: number; r: number; v: number }[] = [];
  const all: { a: number; r: number; v: number }[] = [];
  for (let a = 0; a < nA; a++)
    for (let r = 1; r < nR - 1; r++) {
      const v = acc[a * nR + r - 1] + acc[a * nR + r] + acc[a * nR + r + 1];
      if (v > 30) all.push({ a, r, v });
    }
  all.sort((p, q) => q.v - p.v);
  for (const c of all) {
    if (peaks.length >= 6) break;
    if (peaks.some((p) => Math.abs(p.a - c.a) * stepDeg < 3 && Math.abs(p.r - c.r) < 10)) continue;
    peaks.push(c);
  }
  let best: Line | null = null;
  for (const peak of peaks) {
    let ex = cosA[peak.a];
    let ey = sinA[peak.a];
    let rho = peak.r - diag;
    for (let pass = 0; pass < 2; pass++) {
      const near: number[] = [];
      for (let i = 0; i < xs.length; i++) if (Math.abs(-xs[i] * ey + ys[i] * ex - rho) <= 3) near.push(i);
      if (near.length < 20) break;
      const tOf = (i: number) => xs[i] * ex + ys[i] * ey;
      near.sort((i, j) => tOf(i) - tOf(j));
      let runStart = 0;
      let bestStart = 0;
      let bestEnd = 0;
      for (let k = 1; k <= near.length; k++) {
        if (k === near.length || tOf(near[k]) - tOf(near[k - 1]) > 6) {
          if (tOf(near[k - 1]) - tOf(near[runStart]) > tOf(near[bestEnd]) - tOf(near[bestStart])) {
            bestStart = runStart;
            bestEnd = k - 1;
          }
          runStart = k;
        }
      }
      const run = near.slice(bestStart, bestEnd + 1);
      // Weighted total least squares through the run.
      let sw = 0;
      let mx = 0;
      let my = 0;
      for (const i of run) {
        sw += vs[i];
        mx += vs[i] * xs[i];
        my += vs[i] * ys[i];
      }
      mx /= sw;
      my /= sw;
      let sxx = 0;
      let sxy = 0;
      let syy = 0;
      for (const i of run) {
        sxx += vs[i] * (xs[i] - mx) ** 2;
        sxy += vs[i] * (xs[i] - mx) * (ys[i] - my);
        syy += vs[i] * (ys[i] - my) ** 2;
      }
      const th = 0.5 * Math.atan2(2 * sxy, sxx - syy);
      ex = Math.cos(th);
      ey = Math.sin(th);
      rho = -mx * ey + my * ex;
      if (pass === 1) {
        const base = mx * ex + my * ey;
        let t0 = Infinity;
        let t1 = -Infinity;
        for (const i of run) {
          const t = xs[i] * ex + ys[i] * ey - base;
          t0 = Math.min(t0, t);
          t1 = Math.max(t1, t);
        }
        const halfWidth = Math.max(0.8, run.length / Math.max(1, t1 - t0) / 2);
        if (!best || t1 - t0 > best.t1 - best.t0) best = { ox: mx, oy: my, ex, ey, t0, t1, halfWidth };
      }
    }
  }
  return best;
}

/**
 * Proposes a trace for one card photograph. Never throws on a picture: a card that cannot be traced
 * comes back with `found: false` and the reasons.
 */
export function proposeCardTrace(image: AutotraceImage): AutotraceProposal {
  // A large photo is first averaged down (a whole number of pixels into one) to about 2 megapixels.
  const factor = Math.floor(Math.sqrt((image.width * image.height) / 2_000_000));
  if (factor < 2 || image.data.length < image.width * image.height * 4) return proposeAtFullSize(image);
  const width = Math.floor(image.width / factor);
  const height = Math.floor(image.height / factor);
  const data = new Uint8Array(width * height * 4);
  for (let y = 0; y < height; y++)
    for (let x = 0; x < width; x++)
      for (let c = 0; c < 4; c++) {
        let sum = 0;
        for (let dy = 0; dy < factor; dy++)
          for (let dx = 0; dx < factor; dx++) sum += image.data[((y * factor + dy) * image.width + x * factor + dx) * 4 + c];
        data[(y * width + x) * 4 + c] = Math.round(sum / (factor * factor));
      }
  const small = proposeAtFullSize({ data, width, height });
  const up = (q: AutotracePoint): AutotracePoint => ({ x: (q.x + 0.5) * factor - 0.5, y: (q.y + 0.5) * factor - 0.5 });
  return {
    ...small,
    atmosphericLine: small.atmosphericLine ? [up(small.atmosphericLine[0]), up(small.atmosphericLine[1])] : null,
    admissionEndPx: small.admissionEndPx ? up(small.admissionEndPx) : null,
    releaseEndPx: small.releaseEndPx ? up(small.releaseEndPx) : null,
    pointsPx: small.pointsPx.map(up),
  };
}

function proposeAtFullSize(image: AutotraceImage): AutotraceProposal {
  const { width: w, height: h, data } = image;
  if (!Number.isInteger(w) || !Number.isInteger(h) || w < 120 || h < 80 || data.length < w * h * 4) return refused(['too-small']);
  const n = w * h;

  // 1. Grey, lightly smoothed; paper brightness by dilation and a wide blur; ink darkness.
  const grey = new Float32Array(n);
  let saturated = 0;
  for (let p = 0; p < n; p++) {
    const v = 0.299 * data[4 * p] + 0.587 * data[4 * p + 1] + 0.114 * data[4 * p + 2];
    grey[p] = v;
  }
  blur2({ data: grey, width: w, height: h }, 1);
  const paperWidth = Math.max(3, Math.round(Math.min(w, h) / 150));
  const paper = maxFilter(grey, w, h, paperWidth + 2);
  blur2({ data: paper, width: w, height: h }, 4 * paperWidth);

  // 2. The card: bright part of the photo, eroded; glare: paper pixels at the top of the range.
  const brightest = percentile(
    paper.filter((_, i) => i % 7 === 0),
    0.95,
  );
  // A wide average of the grey image: thin pen lines hardly darken it, the dark bench does.
  const wide = Float32Array.from(grey);
  blur2({ data: wide, width: w, height: h }, 3 * paperWidth);
  const cardRaw = new Float32Array(n);
  for (let p = 0; p < n; p++) cardRaw[p] = wide[p] > 0.5 * brightest ? 1 : 0;
  blur2({ data: cardRaw, width: w, height: h }, 2 * paperWidth);
  const card = new Uint8Array(n);
  let cardCount = 0;
  for (let p = 0; p < n; p++) {
    const x = p % w;
    const y = (p - x) / w;
    if (cardRaw[p] > 0.995 && x > 2 && y > 2 && x < w - 3 && y < h - 3) {
      card[p] = 1;
      cardCount++;
      if (grey[p] >= 252) saturated++;
    }
  }
  if (cardCount < n * 0.1) return refused(['no-diagram']);
  const dark = new Float32Array(n);
  const darkSample: number[] = [];
  for (let p = 0; p < n; p++) {
    if (!card[p]) continue;
    const d = Math.max(0, (paper[p] - grey[p]) / Math.max(1, paper[p]));
    dark[p] = d;
    if (p % 3 === 0) darkSample.push(d);
  }
  const inkLevel = percentile(darkSample, 0.997);
  const reasons: AutotraceReasonCode[] = [];
  const glare = saturated > 0.03 * cardCount;
  if (inkLevel < 0.1) return refused(glare ? ['low-contrast', 'glare'] : ['low-contrast']);
  const threshold = Math.max(0.08, 0.4 * inkLevel);
  let ink = new Uint8Array(n);
  for (let p = 0; p < n; p++) if (card[p] && dark[p] > threshold) ink[p] = 1;
  // Specks: ink blobs too small to be a pen line.
  const specks = label(ink, w, h, true);
  const minInk = Math.max(12, Math.round(n / 20000));
  for (let p = 0; p < n; p++) if (ink[p] && specks.sizes[specks.labels[p]] < minInk) ink[p] = 0;

  // 3. The atmospheric line.
  const line = findAtmosphericLine(ink, dark, w, h);
  const minLineLength = 0.25 * w;
  if (!line || line.t1 - line.t0 < minLineLength) return refused(glare ? ['no-atmospheric-line', 'glare'] : ['no-atmospheric-line']);
  const at = (t: number): AutotracePoint => ({ x: line.ox + t * line.ex, y: line.oy + t * line.ey });
  const atmosphericLine: [AutotracePoint, AutotracePoint] = [at(line.t0), at(line.t1)];

  // 4. Remove the line but keep where the diagram crosses it.
  const band = line.halfWidth + 1.5;
  const nT = Math.ceil(line.t1 - line.t0) + 1;
  const above = new Uint8Array(nT + 2);
  const below = new Uint8Array(nT + 2);
  const lineInk = new Uint8Array(n);
  const withoutLine = new Uint8Array(ink);
  for (let p = 0; p < n; p++) {
    if (!ink[p]) continue;
    const x = p % w;
    const y = (p - x) / w;
    const t = (x - line.ox) * line.ex + (y - line.oy) * line.ey;
    if (t < line.t0 - band || t > line.t1 + band) continue;
    const s = -(x - line.ox) * line.ey + (y - line.oy) * line.ex;
    const ti = Math.min(nT, Math.max(0, Math.round(t - line.t0)));
    if (Math.abs(s) <= band) {
      lineInk[p] = 1;
      withoutLine[p] = 0;
    } else if (s < 0 && s >= -band - 2.5) above[ti] = 1;
    else if (s > 0 && s <= band + 2.5) below[ti] = 1;
  }
  // Bridge each crossing: an above-run and a below-run close together along the line.
  const runs = (flags: Uint8Array) => {
    const out: [number, number][] = [];
    for (let t = 0; t < flags.length; t++) {
      if (!flags[t]) continue;
      let e = t;
      while (e + 1 < flags.length && flags[e + 1]) e++;
      out.push([t, e]);
      t = e;
    }
    return out;
  };
  const reach = Math.ceil((2 * band) / Math.tan((18 * Math.PI) / 180));
  const keep = new Uint8Array(nT + 2);
  for (const [a0, a1] of runs(above))
    for (const [b0, b1] of runs(below)) {
      if (b0 > a1 + reach || a0 > b1 + reach) continue;
      // Keep the line between the nearest ends of the two runs (and the runs' own span).
      const lo = Math.max(Math.min(a0, b0), Math.min(a1, b1) - 1);
      const hi = Math.min(Math.max(a1, b1), Math.max(a0, b0) + 1);
      for (let t = Math.max(0, Math.min(lo, hi) - 1); t <= Math.min(nT, Math.max(lo, hi) + 1); t++) keep[t] = 1;
    }
  for (let p = 0; p < n; p++) {
    if (!lineInk[p]) continue;
    const x = p % w;
    const y = (p - x) / w;
    const t = (x - line.ox) * line.ex + (y - line.oy) * line.ey;
    const ti = Math.min(nT, Math.max(0, Math.round(t - line.t0)));
    if (keep[ti]) withoutLine[p] = 1;
  }
  const inkWithLine = ink;
  ink = withoutLine;

  // 5. Outside (paper reachable from beyond the card), enclosed regions and the figures around them.
  const lineEnds = [atmosphericLine[0], atmosphericLine[1]];
  const enclose = (ink: Uint8Array, onLine: boolean) => {
    const open = new Uint8Array(n);
    for (let p = 0; p < n; p++) open[p] = ink[p] ? 0 : 1;
    const regions = label(open, w, h, false);
    const outsideLabels = new Set<number>();
    for (let p = 0; p < n; p++) if (open[p] && !card[p]) outsideLabels.add(regions.labels[p]);
    const figures = label(ink, w, h, true);
    const minHole = Math.max(40, Math.round(n / 5000));
    // Hole label → figure label (the figure whose ink borders it) and hole size.
    const holeFigure = new Map<number, number>();
    for (let p = 0; p < n; p++) {
      const r = regions.labels[p];
      if (!r || outsideLabels.has(r) || regions.sizes[r] < minHole || holeFigure.has(r)) continue;
      const x = p % w;
      // The pixel to the left of the first pixel of a region (in scan order) is its border ink.
      if (x > 0 && ink[p - 1]) holeFigure.set(r, figures.labels[p - 1]);
    }
    const figureArea = new Map<number, number>();
    for (const [r, f] of holeFigure) figureArea.set(f, (figureArea.get(f) ?? 0) + regions.sizes[r]);
    const figureBox = new Map<number, [number, number, number, number]>();
    for (let p = 0; p < n; p++) {
      const f = figures.labels[p];
      if (!f || !figureArea.has(f)) continue;
      const x = p % w;
      const y = (p - x) / w;
      const b = figureBox.get(f) ?? [x, y, x, y];
      figureBox.set(f, [Math.min(b[0], x), Math.min(b[1], y), Math.max(b[2], x), Math.max(b[3], y)]);
    }
    // A printed border or frame that encloses the atmospheric line is the card's, not the diagram.
    const candidates = [...figureArea.entries()]
      .filter(([f]) => {
        const b = figureBox.get(f)!;
        // With the line kept (a diagram whose exhaust runs along it), the figure is the line and the diagram: it
        // reaches no further along than the line's own ends, where a frame reaches well beyond them.
        if (onLine)
          return Math.min(...lineEnds.map((e) => e.x)) - b[0] <= band + 3 && b[2] - Math.max(...lineEnds.map((e) => e.x)) <= band + 3;
        return !lineEnds.every((e) => e.x >= b[0] - 2 && e.x <= b[2] + 2 && e.y >= b[1] - 2 && e.y <= b[3] + 2);
      })
      .sort((a, b) => b[1] - a[1]);
    return { open, regions, figures, holeFigure, candidates };
  };
  let { open, regions, figures, holeFigure, candidates } = enclose(ink, false);
  if (candidates.length === 0) {
    // Nothing closed once the line is taken out: the exhaust may run along the atmospheric line itself (a
    // non-condensing engine exhausting at atmospheric pressure), so the line closes the diagram. Try with it kept.
    const withLine = enclose(inkWithLine, true);
    if (withLine.candidates.length > 0) ({ open, regions, figures, holeFigure, candidates } = withLine);
  }
  if (candidates.length === 0) {
    // Ink of a size like a diagram but nothing enclosed: the outline is open.
    const bigInk = figures.sizes.some((s) => s > (line.t1 - line.t0) * 2);
    const codes: AutotraceReasonCode[] = [bigInk ? 'not-closed' : 'no-diagram'];
    if (glare) codes.push('glare');
    return refused(codes, atmosphericLine);
  }
  const [diagramFigure, diagramArea] = candidates[0];
  if (candidates.length > 1 && candidates[1][1] > 0.2 * diagramArea) return refused(['two-diagrams'], atmosphericLine);

  // 6. Lobes: the diagram's enclosed regions; each takes the ink nearest to it.
  const lobes = [...holeFigure.entries()].filter(([, f]) => f === diagramFigure).map(([r]) => r);
  lobes.sort((a, b) => regions.sizes[b] - regions.sizes[a]);
  const lobeIndex = new Map(lobes.map((r, i) => [r, i]));
  const owner = new Int32Array(n).fill(-1);
  let frontier: number[] = [];
  for (let p = 0; p < n; p++) {
    const i = lobeIndex.get(regions.labels[p]);
    if (i !== undefined && open[p]) {
      owner[p] = i;
      frontier.push(p);
    }
  }
  const adjacency = lobes.map(() => new Set<number>());
  while (frontier.length > 0) {
    const nextFrontier: number[] = [];
    for (const p of frontier) {
      const x = p % w;
      const y = (p - x) / w;
      for (let dy = -1; dy <= 1; dy++)
        for (let dx = -1; dx <= 1; dx++) {
          const xx = x + dx;
          const yy = y + dy;
          if (xx < 0 || yy < 0 || xx >= w || yy >= h) continue;
          const q = yy * w + xx;
          if (figures.labels[q] !== diagramFigure) continue;
          if (owner[q] === -1) {
            owner[q] = owner[p];
            nextFrontier.push(q);
          } else if (owner[q] !== owner[p] && !open[q] && !open[p]) {
            adjacency[owner[p]].add(owner[q]);
            adjacency[owner[q]].add(owner[p]);
          }
        }
    }
    frontier = nextFrontier;
  }
  // Senses: the largest lobe is positive work; a lobe meeting it at a crossing runs the other way.
  const sense = lobes.map(() => 0);
  sense[0] = 1;
  const queue = [0];
  while (queue.length > 0) {
    const i = queue.shift()!;
    for (const j of adjacency[i])
      if (sense[j] === 0) {
        sense[j] = -sense[i];
        queue.push(j);
      }
  }

  // Stroke width (for the blur that finds the middle of the stroke).
  let inkCount = 0;
  let edgeCount = 0;
  for (let p = 0; p < n; p++) {
    if (owner[p] < 0) continue;
    if (!open[p]) inkCount++;
    else if ((p % w > 0 && !open[p - 1]) || (p % w < w - 1 && !open[p + 1]) || (p >= w && !open[p - w]) || (p < n - w && !open[p + w]))
      edgeCount++;
  }
  const strokePx = Math.max(1, inkCount / Math.max(1, edgeCount * 1.1));
  const sigma = Math.max(1.5, strokePx);

  const rings: AutotracePoint[][] = [];
  for (let i = 0; i < lobes.length; i++) {
    if (sense[i] === 0) continue;
    let x0 = w;
    let y0 = h;
    let x1 = 0;
    let y1 = 0;
    for (let p = 0; p < n; p++) {
      if (owner[p] !== i) continue;
      const x = p % w;
      const y = (p - x) / w;
      x0 = Math.min(x0, x);
      x1 = Math.max(x1, x);
      y0 = Math.min(y0, y);
      y1 = Math.max(y1, y);
    }
    const m = Math.ceil(3 * sigma) + 2;
    x0 = Math.max(0, x0 - m);
    y0 = Math.max(0, y0 - m);
    x1 = Math.min(w - 1, x1 + m);
    y1 = Math.min(h - 1, y1 + m);
    const bw = x1 - x0 + 1;
    const bh = y1 - y0 + 1;
    const field = new Float64Array(bw * bh);
    for (let y = y0; y <= y1; y++)
      for (let x = x0; x <= x1; x++) {
        const p = y * w + x;
        if (owner[p] === i) field[(y - y0) * bw + (x - x0)] = open[p] ? 1 : 0.5;
      }
    blur2({ data: field, width: bw, height: bh }, sigma);
    const shapes = contours().size([bw, bh]).thresholds([0.5])(Array.from(field));
    let bestRing: [number, number][] | null = null;
    let bestArea = 0;
    for (const poly of shapes[0]?.coordinates ?? [])
      for (const ring of poly) {
        const a = Math.abs(polygonArea(ring as [number, number][]));
        if (a > bestArea) {
          bestArea = a;
          bestRing = ring as [number, number][];
        }
      }
    if (!bestRing) continue;
    let ring = bestRing.slice(0, -1).map(([x, y]) => ({ x: x + x0, y: y + y0 }));
    ring = simplify(ring, 0.35, true);
    // Clockwise on screen (y down) for positive work, counter-clockwise for a negative loop.
    const a = polygonArea(ring.map((q) => [q.x, q.y] as [number, number]));
    if (Math.sign(a) !== sense[i]) ring.reverse();
    rings.push(ring);
  }
  if (rings.length === 0) return refused(['no-diagram'], atmosphericLine);

  // Join the loops into one outline: out along a bridge to the loop, round it, and back.
  const outline = rings[0].slice();
  for (const ring of rings.slice(1)) {
    let bi = 0;
    let bj = 0;
    let bd = Infinity;
    for (let i = 0; i < outline.length; i++)
      for (let j = 0; j < ring.length; j++) {
        const d = (outline[i].x - ring[j].x) ** 2 + (outline[i].y - ring[j].y) ** 2;
        if (d < bd) {
          bd = d;
          bi = i;
          bj = j;
        }
      }
    const loop = [...ring.slice(bj), ...ring.slice(0, bj), ring[bj]];
    outline.splice(bi + 1, 0, ...loop, { ...outline[bi] });
  }

  // Ends of the diagram along the atmospheric line; the admission end is nearer the highest point.
  const along = (q: AutotracePoint) => (q.x - line.ox) * line.ex + (q.y - line.oy) * line.ey;
  const upOf = (q: AutotracePoint) => (q.x - line.ox) * line.ey - (q.y - line.oy) * line.ex;
  // The pen's furthest reach each way is found from the ink (a thin toe has no enclosed paper for
  // the outline to follow into), less half the stroke, since the outline runs along its middle.
  let tLo = Infinity;
  let tHi = -Infinity;
  for (let p = 0; p < n; p++) {
    if (figures.labels[p] !== diagramFigure || lineInk[p]) continue;
    const x = p % w;
    const q = { x, y: (p - x) / w };
    // Ink along the atmospheric line (its blurred fringe, left where the diagram crosses it) is no end.
    if (Math.abs(upOf(q)) <= band + 2) continue;
    const t = along(q);
    if (t < tLo) tLo = t;
    if (t > tHi) tHi = t;
  }
  tLo += strokePx / 2 - 0.5;
  tHi -= strokePx / 2 - 0.5;
  // Where the outline itself reaches as far (a square end, not a thin toe), its own end is the truer.
  let pLo = Infinity;
  let pHi = -Infinity;
  for (const q of outline) {
    pLo = Math.min(pLo, along(q));
    pHi = Math.max(pHi, along(q));
  }
  if (Math.abs(pLo - tLo) <= 3) tLo = pLo;
  if (Math.abs(pHi - tHi) <= 3) tHi = pHi;
  let top = outline[0];
  for (const q of outline) if (upOf(q) > upOf(top)) top = q;
  const admissionAtLow = along(top) - tLo < tHi - along(top);
  const lo = at(tLo);
  const hi = at(tHi);
  const round = (q: AutotracePoint): AutotracePoint => ({ x: Math.round(q.x * 100) / 100, y: Math.round(q.y * 100) / 100 });

  // Confidence: contrast, how straight the line is, stray enclosed areas, loops, glare.
  let confidence = Math.min(1, inkLevel / 0.35);
  if (glare) {
    confidence *= 0.6;
    reasons.push('glare');
  }
  if (rings.length > 1) {
    confidence *= 0.85;
    reasons.push('several-loops');
  }
  if (candidates.length > 1) confidence *= 1 - candidates[1][1] / diagramArea;
  if (inkLevel < 0.2) reasons.push('low-contrast');
  return {
    found: true,
    atmosphericLine: [round(atmosphericLine[0]), round(atmosphericLine[1])],
    admissionEndPx: round(admissionAtLow ? lo : hi),
    releaseEndPx: round(admissionAtLow ? hi : lo),
    pointsPx: outline.map(round),
    confidence: Math.round(confidence * 100) / 100,
    reasons: reasons.map(reason),
    loops: rings.length,
  };
}
