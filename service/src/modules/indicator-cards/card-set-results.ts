/**
 * A card set's results, composed from the pure calculations (no formula of its own lives here):
 * each card's mean effective pressure (indicator-card.ts), indicated power per end, cylinder and
 * engine with the referred MEP (indicated-power.ts), the ideal card and diagram factor
 * (ideal-card.ts), steam accounted for by the diagram (steam-if97.ts), the receiver drop, the share
 * of work and the mechanical efficiency against a brake figure.
 */
import type {
  CardInput,
  CardOutlinePointDto,
  CardSetCylinder,
  CardSetCylinderResult,
  CardSetEndResult,
  CardSetResults,
  CardMethod,
  CardTrace,
  CylinderEnd,
  CylinderRole,
  DiagramSteamDto,
  IdealCardResult,
  TraceCalibrationResponse,
} from '@crankjournal/shared-types';
import { calibrateTrace, mepFromOrdinates, mepFromPlanimeter } from '../../calculations/indicator-card.js';
import {
  CalculationInputError,
  computeIndicatedPower,
  effectiveAreaSqIn,
  incompleteSetReason,
  mechanicalEfficiency,
  receiverDropPsi,
  workShareByCylinder,
} from '../../calculations/indicated-power.js';
import { diagramFactor, idealCardPoints, idealMeanEffectivePressurePsi } from '../../calculations/ideal-card.js';
import { cylinderVolumeFt3, steamAccountedForByDiagram } from '../../calculations/steam-if97.js';
import {
  highestPressurePsig,
  lowerLinePressurePsig,
  upperLinePressurePsig,
  type CardOutlinePoint,
} from '../../calculations/card-diagram.js';
import { PSI_PER_INCH_OF_MERCURY, vacuumInHgToPsia } from '../../calculations/vacuum.js';
import { STANDARD_ATMOSPHERE_PSI, hpToKw, psiaToPsig, psigToPsia } from '../../calculations/units.js';

/** Points the ideal card is drawn with along its expansion line. */
const IDEAL_CARD_SEGMENTS = 24;

export const CYLINDER_END_WORDS: Record<CylinderEnd, string> = { head: 'head end', crank: 'crank end' };
const END_ORDER: Record<CylinderEnd, number> = { head: 0, crank: 1 };

// ---------------------------------------------------------------------------------------------
// One card: which way it gives its mean height, and what that comes to
// ---------------------------------------------------------------------------------------------

/** The calc module's parameter names, as the person sending a trace knows them. */
const TRACE_FIELD_NAMES: [RegExp, string][] = [
  [/tracePx/g, 'pointsPx'],
  [/diagramStartPx/g, 'admissionEndPx'],
  [/diagramEndPx/g, 'releaseEndPx'],
  [/cardLengthIn/g, 'lengthIn'],
  [/give lengthIn or pixelsPerInch/g, 'give lengthIn (or trace.pixelsPerInch)'],
];

function isGiven(v: unknown): boolean {
  return v !== undefined && v !== null;
}

function requirePositive(value: unknown, path: string): number {
  if (typeof value !== 'number' || !Number.isFinite(value)) throw new CalculationInputError(path, 'must be a finite number');
  if (value <= 0) throw new CalculationInputError(path, 'must be greater than zero');
  return value;
}

/** A trace calibrated: card coordinates, area and mean pressure (indicator-card.ts calibrateTrace). */
export function calibrateCardTrace(
  trace: CardTrace,
  springPsiPerIn: number,
  lengthIn: number | null | undefined,
  path = 'trace',
): TraceCalibrationResponse {
  let r;
  try {
    r = calibrateTrace({
      atmosphericLine: trace.atmosphericLine,
      diagramStartPx: trace.admissionEndPx,
      diagramEndPx: trace.releaseEndPx,
      tracePx: trace.pointsPx,
      springPsiPerIn,
      cardLengthIn: isGiven(lengthIn) ? (lengthIn as number) : undefined,
      pixelsPerInch: isGiven(trace.pixelsPerInch) ? (trace.pixelsPerInch as number) : undefined,
    });
  } catch (e) {
    if (!(e instanceof RangeError)) throw e;
    const message = TRACE_FIELD_NAMES.reduce((m, [from, to]) => m.replace(from, to), e.message);
    throw new CalculationInputError(path, message);
  }
  const outline = r.points.map((p) => ({ strokeFraction: p.strokeFraction, pressurePsig: p.pressurePsig }));
  return {
    areaSqIn: r.areaSqIn,
    lengthIn: r.lengthIn,
    meanHeightIn: r.meanHeightIn,
    meanEffectivePressurePsi: r.meanEffectivePressurePsi,
    admissionPressurePsig: highestPressurePsig(outline),
    horizontalPixelsPerInch: r.horizontalPixelsPerInch,
    verticalPixelsPerInch: r.verticalPixelsPerInch,
    atmosphericLineTiltDeg: (r.atmosphericLineTiltRad * 180) / Math.PI,
    outline,
  };
}

export interface EvaluatedCard {
  method: CardMethod;
  meanEffectivePressurePsi: number;
  meanHeightIn: number | null;
  /** A trace's area (in²), or the planimeter area typed in. */
  tracedAreaSqIn: number | null;
  outline: CardOutlinePointDto[] | null;
  /** A trace's own admission pressure (top of the card), psig. */
  traceAdmissionPressurePsig: number | null;
}

/** The card's inputs in the shape of a stored card (null where not given). */
export type CardFigures = Pick<
  CardInput,
  'springPsiPerIn' | 'lengthIn' | 'areaSqIn' | 'ordinatesIn' | 'meanEffectivePressurePsi' | 'imageId' | 'trace'
>;

/**
 * Checks that a card gives exactly one way to its mean height (MEP typed in; planimeter area with
 * length and spring; mid-ordinates with spring; a trace on an uploaded image with spring and a scale)
 * and works it out. Throws CalculationInputError naming the field under `path`.
 */
export function evaluateCard(card: CardFigures, path: string): EvaluatedCard {
  const ways: { method: CardMethod; field: string; given: boolean }[] = [
    { method: 'mep', field: 'meanEffectivePressurePsi', given: isGiven(card.meanEffectivePressurePsi) },
    { method: 'planimeter', field: 'areaSqIn', given: isGiven(card.areaSqIn) },
    { method: 'ordinates', field: 'ordinatesIn', given: isGiven(card.ordinatesIn) },
    { method: 'trace', field: 'trace', given: isGiven(card.trace) },
  ];
  const given = ways.filter((w) => w.given);
  if (given.length === 0) {
    throw new CalculationInputError(
      path,
      'give one of meanEffectivePressurePsi; areaSqIn with lengthIn and springPsiPerIn; ordinatesIn with springPsiPerIn; ' +
        'trace with imageId and springPsiPerIn',
    );
  }
  if (given.length > 1) {
    throw new CalculationInputError(
      `${path}.${given[1].field}`,
      `a card gives only one way to its mean pressure, but ${given.map((w) => w.field).join(' and ')} were given`,
    );
  }
  const method = given[0].method;
  switch (method) {
    case 'mep': {
      const mep = card.meanEffectivePressurePsi as number;
      if (typeof mep !== 'number' || !Number.isFinite(mep))
        throw new CalculationInputError(`${path}.meanEffectivePressurePsi`, 'must be a finite number');
      return {
        method,
        meanEffectivePressurePsi: mep,
        meanHeightIn: null,
        tracedAreaSqIn: null,
        outline: null,
        traceAdmissionPressurePsig: null,
      };
    }
    case 'planimeter': {
      const areaSqIn = card.areaSqIn as number;
      if (typeof areaSqIn !== 'number' || !Number.isFinite(areaSqIn) || areaSqIn < 0)
        throw new CalculationInputError(`${path}.areaSqIn`, 'must be a number of at least 0');
      const lengthIn = requirePositive(card.lengthIn, `${path}.lengthIn`);
      const springPsiPerIn = requirePositive(card.springPsiPerIn, `${path}.springPsiPerIn`);
      const r = mepFromPlanimeter({ areaSqIn, lengthIn, springPsiPerIn });
      return {
        method,
        meanEffectivePressurePsi: r.meanEffectivePressurePsi,
        meanHeightIn: r.meanHeightIn,
        tracedAreaSqIn: areaSqIn,
        outline: null,
        traceAdmissionPressurePsig: null,
      };
    }
    case 'ordinates': {
      const ordinatesIn = card.ordinatesIn as number[];
      if (!Array.isArray(ordinatesIn) || ordinatesIn.length < 2)
        throw new CalculationInputError(`${path}.ordinatesIn`, 'needs at least two ordinates');
      ordinatesIn.forEach((o, k) => {
        if (typeof o !== 'number' || !Number.isFinite(o))
          throw new CalculationInputError(`${path}.ordinatesIn[${k}]`, 'must be a finite number');
      });
      const springPsiPerIn = requirePositive(card.springPsiPerIn, `${path}.springPsiPerIn`);
      const r = mepFromOrdinates({ ordinatesIn, springPsiPerIn });
      return {
        method,
        meanEffectivePressurePsi: r.meanEffectivePressurePsi,
        meanHeightIn: r.meanHeightIn,
        tracedAreaSqIn: null,
        outline: null,
        traceAdmissionPressurePsig: null,
      };
    }
    case 'trace': {
      if (!isGiven(card.imageId)) throw new CalculationInputError(`${path}.imageId`, 'a trace needs the uploaded image it was made on');
      const springPsiPerIn = requirePositive(card.springPsiPerIn, `${path}.springPsiPerIn`);
      if (isGiven(card.lengthIn)) requirePositive(card.lengthIn, `${path}.lengthIn`);
      const r = calibrateCardTrace(card.trace as CardTrace, springPsiPerIn, card.lengthIn, `${path}.trace`);
      return {
        method,
        meanEffectivePressurePsi: r.meanEffectivePressurePsi,
        meanHeightIn: r.meanHeightIn,
        tracedAreaSqIn: r.areaSqIn,
        outline: r.outline,
        traceAdmissionPressurePsig: r.admissionPressurePsig,
      };
    }
  }
}

// ---------------------------------------------------------------------------------------------
// The set
// ---------------------------------------------------------------------------------------------

export interface ResultCard {
  id: string;
  cylinderId: string;
  end: CylinderEnd;
  meanEffectivePressurePsi: number;
  cutOffPercent: number | null;
  compressionPercent: number | null;
  /** Admission pressure read off the card by the person, psig. */
  admissionPressurePsig: number | null;
  outline: CardOutlinePoint[] | null;
}

export interface CardSetResultsInput {
  speedRpm: number;
  cylinders: CardSetCylinder[];
  cards: ResultCard[];
  cutOffPercent: number | null;
  throttlePressurePsig: number | null;
  receiverPressurePsig: number | null;
  vacuumInHg: number | null;
  /** The site barometer, inHg absolute; null: the standard atmosphere (with a note). */
  barometerInHg?: number | null;
  /** The engine logs a vacuum (condensing); without one the exhaust is taken as atmospheric. */
  condensing: boolean;
  brake: { figureId: string; measuredAt: string; brakeHorsepower: number } | null;
  computedAt: Date;
}

/** Expansion stage of a cylinder: high first, low last; a simple engine's cylinders are all stage 0. */
const STAGE_RANK: Record<CylinderRole, number> = { single: 0, high: 0, intermediate: 1, low: 2 };

const fixed = (x: number, d = 1) => x.toFixed(d);

/** Works out everything a card set stands for. Pure; never throws for missing figures (they become notes). */
export function computeCardSetResults(input: CardSetResultsInput): CardSetResults {
  const notes: string[] = [];
  const { cylinders, cards, speedRpm } = input;

  // Stages present, in order, and the pressures on each side of each stage.
  const ranks = [...new Set(cylinders.map((c) => STAGE_RANK[c.role]))].sort((a, b) => a - b);
  const stageOf = (c: CardSetCylinder) => ranks.indexOf(STAGE_RANK[c.role]);
  const stages = ranks.length;
  // Gauge and vacuum readings are turned absolute against the site's barometer where one is known.
  const barometerInHg = input.barometerInHg ?? null;
  const atmosphericPsia = barometerInHg !== null ? barometerInHg * PSI_PER_INCH_OF_MERCURY : STANDARD_ATMOSPHERE_PSI;
  if (barometerInHg === null) {
    notes.push(
      'No barometer reading: vacuum and gauge pressures are turned absolute against the standard atmosphere ' +
        `(${fixed(STANDARD_ATMOSPHERE_PSI / PSI_PER_INCH_OF_MERCURY, 2)} inHg, ${fixed(STANDARD_ATMOSPHERE_PSI, 3)} psia).`,
    );
  }
  const toPsia = (psig: number) => psigToPsia(psig, atmosphericPsia);
  const throttlePsia = input.throttlePressurePsig !== null ? toPsia(input.throttlePressurePsig) : null;
  const receiverPsia = input.receiverPressurePsig !== null ? toPsia(input.receiverPressurePsig) : null;
  let exhaustPsia: number | null = null;
  if (input.vacuumInHg !== null) {
    try {
      exhaustPsia = vacuumInHgToPsia(input.vacuumInHg, atmosphericPsia);
    } catch (e) {
      notes.push(`The vacuum of ${input.vacuumInHg} inHg cannot be right (${(e as Error).message}); no exhaust pressure.`);
    }
  } else if (!input.condensing) {
    exhaustPsia = atmosphericPsia;
  }
  const admissionOf = (s: number): number | null => (s === 0 ? throttlePsia : s === 1 && stages === 2 ? receiverPsia : null);
  const backOf = (s: number): number | null => (s === stages - 1 ? exhaustPsia : s === 0 && stages === 2 ? receiverPsia : null);

  // Indicated power of the cylinders that have cards (indicated-power.ts).
  const carded = cylinders.filter((c) => cards.some((k) => k.cylinderId === c.cylinderId));
  const power =
    carded.length > 0
      ? computeIndicatedPower({
          rpm: speedRpm,
          strokeIn: carded[0].strokeIn,
          cylinders: carded.map((c) => ({
            label: c.label,
            boreIn: c.boreIn,
            pistonRodIn: c.pistonRodIn,
            tailRodIn: c.tailRodIn,
            strokeIn: c.strokeIn,
            cards: cards
              .filter((k) => k.cylinderId === c.cylinderId)
              .sort((a, b) => END_ORDER[a.end] - END_ORDER[b.end])
              .map((k) => ({ end: k.end, meanEffectivePressurePsi: k.meanEffectivePressurePsi })),
          })),
        })
      : null;

  const missingEnds: CardSetResults['missingEnds'] = [];
  const cylinderResults: CardSetCylinderResult[] = cylinders.map((cyl) => {
    const stage = stageOf(cyl);
    const admissionPsia = admissionOf(stage);
    const backPsia = backOf(stage);
    const clearanceFraction = cyl.clearancePercent / 100;
    for (const end of ['head', 'crank'] as const) {
      if (!cards.some((k) => k.cylinderId === cyl.cylinderId && k.end === end))
        missingEnds.push({ cylinderId: cyl.cylinderId, cylinderLabel: cyl.label, end });
    }
    const i = carded.indexOf(cyl);
    const powered = i >= 0 && power ? power.cylinders[i] : null;
    const ends: CardSetEndResult[] = (powered?.ends ?? []).map((e) => {
      const card = cards.find((k) => k.cylinderId === cyl.cylinderId && k.end === e.end)!;
      const where = `${cyl.label} ${CYLINDER_END_WORDS[e.end]}`;
      const cutOffPercent = card.cutOffPercent ?? input.cutOffPercent;
      let ideal: IdealCardResult | null = null;
      let idealMissing: string | null = null;
      let factor: number | null = null;
      if (cutOffPercent === null) idealMissing = 'no cut-off recorded';
      else if (admissionPsia === null) idealMissing = stage === 0 ? 'no throttle pressure recorded' : 'no receiver pressure recorded';
      else if (backPsia === null) idealMissing = stage === stages - 1 ? 'no vacuum recorded' : 'no receiver pressure recorded';
      else {
        const basis = { admissionPressurePsia: admissionPsia, cutoffFraction: cutOffPercent / 100, backPressurePsia: backPsia };
        try {
          const mep = idealMeanEffectivePressurePsi(basis);
          ideal = {
            admissionPressurePsia: admissionPsia,
            backPressurePsia: backPsia,
            cutOffFraction: cutOffPercent / 100,
            clearanceFraction,
            meanEffectivePressurePsi: mep,
            meanEffectivePressureWithClearancePsi: idealMeanEffectivePressurePsi({ ...basis, clearanceFraction }),
            outline: idealCardPoints({ ...basis, expansionSegments: IDEAL_CARD_SEGMENTS }).map((p) => ({
              strokeFraction: p.strokeFraction,
              pressurePsig: psiaToPsig(p.pressurePsia, atmosphericPsia),
            })),
          };
          factor = diagramFactor({ actualMeanEffectivePressurePsi: e.meanEffectivePressurePsi, idealMeanEffectivePressurePsi: mep });
        } catch (err) {
          idealMissing = (err as Error).message;
          ideal = null;
        }
      }
      if (idealMissing) notes.push(`${where}: no ideal card (${idealMissing}).`);

      // Steam accounted for by this end's diagram (steam-if97.ts), from the points at cut-off and compression.
      let steam: DiagramSteamDto | null = null;
      if (cutOffPercent !== null && e.indicatedHorsepower > 0) {
        const k = cutOffPercent / 100;
        const kc = (card.compressionPercent ?? 0) / 100;
        let expansionPsia: number | null = null;
        let expansionPressureBasis: DiagramSteamDto['expansionPressureBasis'] = 'logged';
        const traced = card.outline ? upperLinePressurePsig(card.outline, k) : null;
        if (traced !== null) {
          expansionPsia = toPsia(traced);
          expansionPressureBasis = 'trace';
        } else if (card.admissionPressurePsig !== null) {
          expansionPsia = toPsia(card.admissionPressurePsig);
          expansionPressureBasis = 'card';
        } else expansionPsia = admissionPsia;
        const tracedLow = card.outline && kc > 0 ? lowerLinePressurePsig(card.outline, kc) : null;
        const compressionPsia = tracedLow !== null ? toPsia(tracedLow) : backPsia;
        if (expansionPsia !== null && compressionPsia !== null) {
          const geometry = { effectiveAreaSqIn: e.effectiveAreaSqIn, strokeIn: cyl.strokeIn, clearanceFraction };
          const expansionVolumeFt3 = cylinderVolumeFt3({ ...geometry, strokeFraction: k });
          const compressionVolumeFt3 = cylinderVolumeFt3({ ...geometry, strokeFraction: kc });
          try {
            const s = steamAccountedForByDiagram({
              expansionVolumeFt3,
              expansionPressurePsia: expansionPsia,
              compressionVolumeFt3,
              compressionPressurePsia: compressionPsia,
              speedRpm,
              strokesPerRevolution: 1,
              indicatedHorsepower: e.indicatedHorsepower,
            });
            steam = {
              expansionVolumeFt3,
              expansionPressurePsia: expansionPsia,
              compressionVolumeFt3,
              compressionPressurePsia: compressionPsia,
              expansionPressureBasis,
              steamPerHourLb: s.steamPerHourLb,
              steamPerIhpHourLb: s.steamPerIhpHourLb,
            };
          } catch (err) {
            notes.push(`${where}: no steam figure (${(err as Error).message}).`);
          }
        }
      }
      return {
        end: e.end,
        cardId: card.id,
        meanEffectivePressurePsi: e.meanEffectivePressurePsi,
        effectiveAreaSqIn: e.effectiveAreaSqIn,
        indicatedHorsepower: e.indicatedHorsepower,
        ideal,
        idealMissing,
        diagramFactor: factor,
        steam,
      };
    });
    const ihp = powered?.indicatedHorsepower ?? 0;
    return {
      cylinderId: cyl.cylinderId,
      label: cyl.label,
      role: cyl.role,
      indicatedHorsepower: ihp,
      indicatedKilowatts: hpToKw(ihp),
      workShare: null,
      admissionPressurePsia: admissionPsia,
      backPressurePsia: backPsia,
      ends,
    };
  });

  const total = power?.totalIndicatedHorsepower ?? 0;
  if (missingEnds.length)
    notes.push(
      `Not yet taken: ${missingEnds.map((m) => `${m.cylinderLabel} ${CYLINDER_END_WORDS[m.end]}`).join(', ')}. ` +
        "The totals are the sum of the cards present, not the engine's indicated power.",
    );

  // Share of the work and the referred MEP (indicated-power.ts): only from a complete set.
  const complete = missingEnds.length === 0 && cylinders.length > 0;
  const incompleteReason = complete ? null : cylinders.length === 0 ? 'the engine has no cylinders' : incompleteSetReason(missingEnds);
  let workSharesMissing: string | null = incompleteReason;
  if (complete && total > 0) {
    const shares = workShareByCylinder(cylinderResults.map((c) => ({ label: c.label, indicatedHorsepower: c.indicatedHorsepower })));
    cylinderResults.forEach((c, i) => (c.workShare = shares[i].share));
  } else if (complete) workSharesMissing = 'the cards give no indicated power';

  // The largest cylinder by swept volume, which the referred MEP is referred to.
  let referredToCylinderLabel: string | null = null;
  if (complete && power) {
    const swept = (c: CardSetCylinder) =>
      ((effectiveAreaSqIn(c.boreIn, c.tailRodIn) + effectiveAreaSqIn(c.boreIn, c.pistonRodIn)) / 2) * c.strokeIn;
    referredToCylinderLabel = cylinders.reduce((a, b) => (swept(b) > swept(a) ? b : a)).label;
  }

  // Receiver drop: the receiver pressure less the low-pressure cylinder's admission read off its cards.
  let lowPressureAdmissionPsig: number | null = null;
  let drop: number | null = null;
  if (stages === 2) {
    const lpAdmissions = cards
      .filter((k) => {
        const c = cylinders.find((x) => x.cylinderId === k.cylinderId);
        return c && stageOf(c) === 1;
      })
      .map((k) => k.admissionPressurePsig ?? (k.outline ? highestPressurePsig(k.outline) : null))
      .filter((p): p is number => p !== null);
    if (lpAdmissions.length) lowPressureAdmissionPsig = lpAdmissions.reduce((a, b) => a + b, 0) / lpAdmissions.length;
    if (input.receiverPressurePsig !== null && lowPressureAdmissionPsig !== null) {
      drop = receiverDropPsi({ receiverPressurePsi: input.receiverPressurePsig, lpAdmissionPressurePsi: lowPressureAdmissionPsig });
    } else if (input.receiverPressurePsig === null) notes.push('No receiver pressure recorded: no receiver drop.');
    else notes.push('No admission pressure read off the low-pressure cards: no receiver drop.');
  }

  // Mechanical efficiency against the nearest brake or measured output figure (indicated-power.ts): only from a
  // complete set, and never above 1 (that is an error in the inputs, said so).
  let brake: CardSetResults['brake'] = null;
  if (input.brake) {
    let efficiency: number | null = null;
    let efficiencyMissing: string | null = incompleteReason;
    if (complete && total > 0) {
      try {
        efficiency = mechanicalEfficiency({ brakeHorsepower: input.brake.brakeHorsepower, indicatedHorsepower: total });
      } catch (err) {
        if (!(err instanceof CalculationInputError)) throw err;
        efficiencyMissing = `input error: ${err.message}`;
      }
    } else if (complete) efficiencyMissing = 'the cards give no indicated power';
    if (efficiencyMissing) notes.push(`No mechanical efficiency: ${efficiencyMissing}.`);
    brake = {
      ...input.brake,
      mechanicalEfficiency: efficiency,
      mechanicalEfficiencyMissing: efficiency === null ? efficiencyMissing : null,
    };
  }

  // Steam accounted for: the first cylinder's diagrams, charged to the engine's whole indicated power.
  let steamAccountedForLbPerIhpHour: number | null = null;
  const first = cylinderResults.filter((c) => stageOf(cylinders.find((x) => x.cylinderId === c.cylinderId)!) === 0);
  const firstEnds = first.flatMap((c) => c.ends);
  if (missingEnds.length === 0 && total > 0 && firstEnds.length > 0 && firstEnds.every((e) => e.steam)) {
    steamAccountedForLbPerIhpHour = firstEnds.reduce((sum, e) => sum + e.steam!.steamPerHourLb, 0) / total;
  } else if (total > 0) {
    notes.push('Steam accounted for needs both cards of the first cylinder with a cut-off, and every card of the set.');
  }

  if (input.speedRpm > 0 && total === 0 && cards.length > 0) notes.push(`The cards give no indicated power at ${fixed(speedRpm)} rpm.`);

  return {
    speedRpm,
    complete,
    missingEnds,
    cylinders: cylinderResults,
    totalIndicatedHorsepower: total,
    totalIndicatedKilowatts: hpToKw(total),
    referredMeanEffectivePressurePsi: complete && power ? power.referredMeanEffectivePressurePsi : null,
    referredToCylinderLabel,
    referredMeanEffectivePressureMissing: complete && power ? null : (incompleteReason ?? 'the cards give no indicated power'),
    workSharesMissing,
    receiverPressurePsig: input.receiverPressurePsig,
    lowPressureAdmissionPsig,
    receiverDropPsi: drop,
    brake,
    steamAccountedForLbPerIhpHour,
    atmosphericPressurePsia: atmosphericPsia,
    atmosphereBasis: barometerInHg !== null ? 'barometer' : 'standard',
    notes,
    computedAt: input.computedAt.toISOString(),
  };
}
