import { create, all } from 'mathjs';
import {
  Point,
  calibrateTrace,
  meanHeightFromOrdinatesIn,
  mepFromOrdinates,
  mepFromPlanimeter,
  midOrdinateStationsFraction,
  shoelaceArea,
  signedShoelaceArea,
} from './indicator-card.js';

const math = create(all);

describe('planimeter figure → mean height → MEP', () => {
  it(
    '2.6 in² card, 3.6 in long, 60-lb spring → mean ordinate 0.722 in, MEP 43.3 psi (Machinery’s Reference Series ' +
      'No. 70, Steam Engines, section on indicated horsepower)',
    () => {
      const result = mepFromPlanimeter({ areaSqIn: 2.6, lengthIn: 3.6, springPsiPerIn: 60 });
      expect(result.meanHeightIn).toBeCloseTo(0.722, 3);
      expect(result.meanEffectivePressurePsi).toBeCloseTo(43.3, 1);
    },
  );

  it(
    'cover-end card 1200 mm² and crank-end card 1100 mm², 75 mm long, spring 0.15 bar/mm → 2.4 and 2.2 bar (B. ' +
      'Agrawal & C. M. Agrawal, Basic Mechanical Engineering, ch. 13, Ex. 4, p. 286, seen in a worked-solutions reproduction)',
    () => {
      const lengthIn = math.unit(75, 'mm').toNumber('inch');
      const springPsiPerIn = math.unit(0.15, 'bar/mm').toNumber('psi/inch');
      const cover = mepFromPlanimeter({ areaSqIn: math.unit(1200, 'mm^2').toNumber('inch^2'), lengthIn, springPsiPerIn });
      const crank = mepFromPlanimeter({ areaSqIn: math.unit(1100, 'mm^2').toNumber('inch^2'), lengthIn, springPsiPerIn });
      expect(math.unit(cover.meanEffectivePressurePsi, 'psi').toNumber('bar')).toBeCloseTo(2.4, 6);
      expect(math.unit(crank.meanEffectivePressurePsi, 'psi').toNumber('bar')).toBeCloseTo(2.2, 6);
    },
  );

  it('refuses a zero length or spring and a negative area', () => {
    expect(() => mepFromPlanimeter({ areaSqIn: 2.6, lengthIn: 0, springPsiPerIn: 60 })).toThrow(RangeError);
    expect(() => mepFromPlanimeter({ areaSqIn: 2.6, lengthIn: 3.6, springPsiPerIn: 0 })).toThrow(RangeError);
    expect(() => mepFromPlanimeter({ areaSqIn: -1, lengthIn: 3.6, springPsiPerIn: 60 })).toThrow(RangeError);
  });
});

describe('mid-ordinate rule', () => {
  it(
    'ten ordinates stand at equal spacing with the end ones half a spacing from the ends (J. Rose, Modern Machine ' +
      'Shop Practice, section on the indicator, Fig. 3372)',
    () => {
      const stations = midOrdinateStationsFraction(10);
      expect(stations).toHaveLength(10);
      expect(stations[0]).toBeCloseTo(0.05, 12);
      expect(stations[9]).toBeCloseTo(0.95, 12);
      for (let i = 1; i < 10; i++) expect(stations[i] - stations[i - 1]).toBeCloseTo(0.1, 12);
    },
  );

  it('the mean height is the sum of the ordinates divided by their number (J. Rose, Modern Machine Shop Practice, same section)', () => {
    expect(meanHeightFromOrdinatesIn([0.5, 1.0, 1.5, 2.0])).toBeCloseTo(1.25, 12);
    const result = mepFromOrdinates({ ordinatesIn: [0.5, 1.0, 1.5, 2.0], springPsiPerIn: 40 });
    expect(result.meanEffectivePressurePsi).toBeCloseTo(50, 12);
  });

  it(
    'is exact for a card with straight top and bottom lines (the midpoint rule integrates straight lines exactly; ' +
      'common practice, no source)',
    () => {
      // Top line from 1.6 in down to 0.4 in, bottom line at 0.1 in, over a 3.6 in card: a trapezoid.
      const lengthIn = 3.6;
      const height = (x: number) => 1.6 - (1.2 * x) / lengthIn - 0.1;
      const ordinates = midOrdinateStationsFraction(10).map((f) => height(f * lengthIn));
      const trapezoidAreaSqIn = ((1.5 + 0.3) / 2) * lengthIn;
      expect(meanHeightFromOrdinatesIn(ordinates)).toBeCloseTo(trapezoidAreaSqIn / lengthIn, 12);
    },
  );

  it(
    'on a hyperbolic expansion line converges to the exact integral as ordinates are added (analytic ∫ dx/(x+c) = ' +
      'ln; midpoint-rule error falls as 1/n²)',
    () => {
      const c = 0.05;
      const exact = Math.log((1 + c) / c); // mean of 1/(x + c) over x in [0, 1]
      const errorWith = (n: number) =>
        Math.abs(meanHeightFromOrdinatesIn(midOrdinateStationsFraction(n).map((x) => 1 / (x + c))) - exact) / exact;
      expect(errorWith(10)).toBeLessThan(0.05);
      expect(errorWith(40)).toBeLessThan(errorWith(10) / 8);
    },
  );

  it('refuses fewer than two ordinates', () => {
    expect(() => meanHeightFromOrdinatesIn([1])).toThrow(RangeError);
    expect(() => midOrdinateStationsFraction(1)).toThrow(RangeError);
  });
});

describe('shoelace area of a closed polygon (surveyor’s formula; common practice, no source)', () => {
  it('unit square is 1, either way round', () => {
    const square: Point[] = [
      { x: 0, y: 0 },
      { x: 1, y: 0 },
      { x: 1, y: 1 },
      { x: 0, y: 1 },
    ];
    expect(shoelaceArea(square)).toBeCloseTo(1, 12);
    expect(shoelaceArea([...square].reverse())).toBeCloseTo(1, 12);
    expect(signedShoelaceArea(square)).toBeCloseTo(1, 12);
    expect(signedShoelaceArea([...square].reverse())).toBeCloseTo(-1, 12);
  });

  it('right triangle with legs 4 and 3 is 6', () => {
    expect(
      shoelaceArea([
        { x: 0, y: 0 },
        { x: 4, y: 0 },
        { x: 0, y: 3 },
      ]),
    ).toBeCloseTo(6, 12);
  });

  it('rectangle 3.6 × 0.722 in is about 2.6 in², the planimeter figure of the Machinery’s Reference Series example', () => {
    const area = shoelaceArea([
      { x: 0, y: 0 },
      { x: 3.6, y: 0 },
      { x: 3.6, y: 0.722 },
      { x: 0, y: 0.722 },
    ]);
    expect(area).toBeCloseTo(2.5992, 4);
    expect(area).toBeCloseTo(2.6, 2);
  });

  it('repeating the first vertex at the end changes nothing', () => {
    const open = [
      { x: 0, y: 0 },
      { x: 4, y: 0 },
      { x: 0, y: 3 },
    ];
    expect(shoelaceArea([...open, open[0]])).toBeCloseTo(6, 12);
  });

  it('a figure-of-eight trace nets its two loops against each other', () => {
    // Two unit-high triangles of area 1 each, traced in opposite senses.
    const bowtie = [
      { x: 0, y: 0 },
      { x: 2, y: 2 },
      { x: 2, y: 0 },
      { x: 0, y: 2 },
    ];
    expect(shoelaceArea(bowtie)).toBeCloseTo(0, 12);
  });

  it('refuses fewer than three points', () => {
    expect(() =>
      shoelaceArea([
        { x: 0, y: 0 },
        { x: 1, y: 1 },
      ]),
    ).toThrow(RangeError);
  });
});

describe('calibrating a traced card image', () => {
  /**
   * Draws a card (inches, y up, x from the start of the diagram, atmospheric line at y = 0) into a
   * synthetic image: y grows downward, the atmospheric line tilted by `tiltRad`, scales in px per inch.
   */
  function toImage(p: Point, opts: { origin: Point; tiltRad: number; ppiH: number; ppiV: number }): Point {
    const e = { x: Math.cos(opts.tiltRad), y: Math.sin(opts.tiltRad) }; // along the atmospheric line
    const up = { x: Math.sin(opts.tiltRad), y: -Math.cos(opts.tiltRad) }; // upward normal, y-down image
    return {
      x: opts.origin.x + p.x * opts.ppiH * e.x + p.y * opts.ppiV * up.x,
      y: opts.origin.y + p.x * opts.ppiH * e.y + p.y * opts.ppiV * up.y,
    };
  }

  // A card drawn by hand on a 3.6 in base, part of it below the atmospheric line (vacuum):
  // rectangle 3.6 × 0.6 (from −0.2 to 0.4 in) = 2.16 in², plus a trapezoid above 0.4 in with parallel
  // sides 3.6 and 0.9 in and height 1.0 in = 2.25 in²; total 4.41 in², mean height 1.225 in,
  // 80-lb spring → MEP 98 psi. Areas by elementary geometry (common practice, no source).
  const cardIn: Point[] = [
    { x: 0, y: -0.2 },
    { x: 3.6, y: -0.2 },
    { x: 3.6, y: 0.4 },
    { x: 0.9, y: 1.4 },
    { x: 0, y: 1.4 },
  ];
  const opts = { origin: { x: 240, y: 610 }, tiltRad: (3 * Math.PI) / 180, ppiH: 100, ppiV: 100 };
  const atmosphericLine: [Point, Point] = [toImage({ x: -0.5, y: 0 }, opts), toImage({ x: 4.2, y: 0 }, opts)];

  it('recovers area, mean height and MEP of a card drawn at 100 px/in with a 3° tilt, scale from the card length', () => {
    const result = calibrateTrace({
      atmosphericLine,
      // The ends are clicked at the card's corners, off the atmospheric line: only their position along it counts.
      diagramStartPx: toImage({ x: 0, y: 1.4 }, opts),
      diagramEndPx: toImage({ x: 3.6, y: -0.2 }, opts),
      tracePx: cardIn.map((p) => toImage(p, opts)),
      cardLengthIn: 3.6,
      springPsiPerIn: 80,
    });
    expect(result.horizontalPixelsPerInch).toBeCloseTo(100, 9);
    expect(result.verticalPixelsPerInch).toBeCloseTo(100, 9);
    expect(result.atmosphericLineTiltRad).toBeCloseTo(opts.tiltRad, 12);
    expect(result.lengthIn).toBeCloseTo(3.6, 9);
    expect(result.areaSqIn).toBeCloseTo(4.41, 9);
    expect(result.meanHeightIn).toBeCloseTo(1.225, 9);
    expect(result.meanEffectivePressurePsi).toBeCloseTo(98, 9);
    // The admission corner at a quarter stroke, 1.4 in up: 112 psig; the far bottom corner 0.2 in down: −16 psig.
    expect(result.points[3].strokeFraction).toBeCloseTo(0.25, 12);
    expect(result.points[3].pressurePsig).toBeCloseTo(112, 9);
    expect(result.points[1].strokeFraction).toBeCloseTo(1, 12);
    expect(result.points[1].pressurePsig).toBeCloseTo(-16, 9);
  });

  it('gives the same card when the atmospheric line is clicked right to left and the ends are given as x pixels', () => {
    const start = toImage({ x: 0, y: 0 }, opts);
    const end = toImage({ x: 3.6, y: 0 }, opts);
    const result = calibrateTrace({
      atmosphericLine: [atmosphericLine[1], atmosphericLine[0]],
      diagramStartPx: start.x,
      diagramEndPx: end.x,
      tracePx: cardIn.map((p) => toImage(p, opts)),
      cardLengthIn: 3.6,
      springPsiPerIn: 80,
    });
    expect(result.areaSqIn).toBeCloseTo(4.41, 9);
    expect(result.meanEffectivePressurePsi).toBeCloseTo(98, 9);
    expect(result.points[3].pressurePsig).toBeCloseTo(112, 9);
  });

  it('uses a known image scale and a separate vertical scale (non-square pixels: 100 px/in across, 125 px/in up)', () => {
    const skewed = { ...opts, tiltRad: (-2 * Math.PI) / 180, ppiV: 125 };
    const line: [Point, Point] = [toImage({ x: -0.3, y: 0 }, skewed), toImage({ x: 4, y: 0 }, skewed)];
    const result = calibrateTrace({
      atmosphericLine: line,
      diagramStartPx: toImage({ x: 0, y: 0 }, skewed),
      diagramEndPx: toImage({ x: 3.6, y: 0 }, skewed),
      tracePx: cardIn.map((p) => toImage(p, skewed)),
      pixelsPerInch: 100,
      verticalPixelsPerInch: 125,
      springPsiPerIn: 80,
    });
    expect(result.lengthIn).toBeCloseTo(3.6, 9);
    expect(result.areaSqIn).toBeCloseTo(4.41, 9);
    expect(result.meanEffectivePressurePsi).toBeCloseTo(98, 9);
  });

  it('stroke fraction runs from the start end, whichever side of the image it is on', () => {
    const result = calibrateTrace({
      atmosphericLine,
      diagramStartPx: toImage({ x: 3.6, y: 0 }, opts),
      diagramEndPx: toImage({ x: 0, y: 0 }, opts),
      tracePx: cardIn.map((p) => toImage(p, opts)),
      cardLengthIn: 3.6,
      springPsiPerIn: 80,
    });
    expect(result.points[3].strokeFraction).toBeCloseTo(0.75, 12);
    expect(result.meanEffectivePressurePsi).toBeCloseTo(98, 9);
  });

  it('refuses a calibration without a scale, with coincident ends or a near-vertical atmospheric line', () => {
    const base = {
      atmosphericLine,
      diagramStartPx: toImage({ x: 0, y: 0 }, opts),
      diagramEndPx: toImage({ x: 3.6, y: 0 }, opts),
      tracePx: cardIn.map((p) => toImage(p, opts)),
      springPsiPerIn: 80,
    };
    expect(() => calibrateTrace(base)).toThrow(RangeError);
    expect(() => calibrateTrace({ ...base, cardLengthIn: 3.6, diagramEndPx: base.diagramStartPx })).toThrow(RangeError);
    expect(() =>
      calibrateTrace({
        ...base,
        cardLengthIn: 3.6,
        atmosphericLine: [
          { x: 10, y: 10 },
          { x: 12, y: 200 },
        ],
      }),
    ).toThrow(RangeError);
  });
});
