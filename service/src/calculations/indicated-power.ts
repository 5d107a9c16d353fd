/**
 * Indicated power of a double-acting (simple or compound) steam engine from its indicator cards.
 *
 *   IHP (one end) = P · L · A · N / 33,000
 *     P  mean effective pressure of that end's card, psi
 *     L  stroke, ft
 *     A  effective piston area on that side, in²:
 *          head end  = bore area − tail-rod area (0 when there is no tail rod)
 *          crank end = bore area − piston-rod area
 *     N  working strokes of that end per minute = rpm (each end works once per revolution)
 *
 * Compound engines: all the work is referred to the largest cylinder (the low-pressure one):
 *   p_ref = Σ IHP · 33,000 / (L_LP · Ā_LP · 2N)
 * where Ā_LP is the mean of the LP cylinder's two effective areas. By construction the IHP
 * computed from p_ref on the LP cylinder (both ends) equals the sum of all cylinders' IHP; with a
 * common stroke and cards from both ends it is the textbook p_ref = Σ p_i · Ā_i / Ā_LP.
 *
 * Pure functions; inches, feet, psi, rpm, horsepower as named.
 */
import { FT_LBF_PER_MIN_PER_HP, hpToKw } from './units.js';
import { mepFromOrdinates, mepFromPlanimeter } from './indicator-card.js';
import { CalculationInputError } from './errors.js';

export { CalculationInputError };

/** Caution shown beside power and brake figures. */
export const INDICATED_POWER_CAUTION =
  'Power figures aid a qualified crew in judging the engine; they do not clear it to run harder. ' +
  'Brake and load tests follow local codes and licensed practice.';

const INCHES_PER_FOOT = 12;

/** Full area of a piston of the given bore, in². */
export function pistonAreaSqIn(boreIn: number): number {
  return (Math.PI / 4) * boreIn * boreIn;
}

/** Effective piston area on one side (bore area less the rod passing through that side), in². */
export function effectiveAreaSqIn(boreIn: number, rodIn = 0): number {
  return pistonAreaSqIn(boreIn) - pistonAreaSqIn(rodIn);
}

/**
 * Indicated horsepower of ONE end of a double-acting cylinder: P·L·A·N/33,000 with N = rpm
 * (one working stroke per end per revolution).
 */
export function endIndicatedHorsepower(input: {
  meanEffectivePressurePsi: number;
  strokeIn: number;
  effectiveAreaSqIn: number;
  speedRpm: number;
}): number {
  const strokeFt = input.strokeIn / INCHES_PER_FOOT;
  return (input.meanEffectivePressurePsi * strokeFt * input.effectiveAreaSqIn * input.speedRpm) / FT_LBF_PER_MIN_PER_HP;
}

/**
 * Mechanical efficiency (fraction): brake or measured output horsepower ÷ indicated horsepower.
 * An engine cannot put out more at the shaft than its cylinders indicate, so a ratio above 1 is an error in the
 * inputs (a brake figure from another load, a card set missing ends, a wrong spring) and throws rather than being shown.
 */
export function mechanicalEfficiency(input: { brakeHorsepower: number; indicatedHorsepower: number }): number {
  if (!(input.indicatedHorsepower > 0)) throw new CalculationInputError(null, 'indicatedHorsepower must be greater than zero');
  if (!(Number.isFinite(input.brakeHorsepower) && input.brakeHorsepower >= 0))
    throw new CalculationInputError(null, 'brakeHorsepower must be a number of at least 0');
  const efficiency = input.brakeHorsepower / input.indicatedHorsepower;
  if (efficiency > 1) {
    throw new CalculationInputError(
      null,
      `the brake figure (${input.brakeHorsepower.toFixed(1)} hp) is more than the indicated power ` +
        `(${input.indicatedHorsepower.toFixed(1)} ihp): a mechanical efficiency above 1 is an error in the inputs ` +
        '(check the brake figure, the springs and that every card of the set is taken)',
    );
  }
  return efficiency;
}

/** Effective radius of a rope brake: half of (drum diameter + rope diameter), ft. */
export function ropeBrakeEffectiveRadiusFt(input: { drumDiameterFt: number; ropeDiameterFt?: number }): number {
  return (input.drumDiameterFt + (input.ropeDiameterFt ?? 0)) / 2;
}

/** Brake torque, lbf·ft = net brake load (dead load less spring balance), lbf × effective radius, ft. */
export function brakeTorqueLbfFt(input: { netBrakeLoadLbf: number; effectiveRadiusFt: number }): number {
  return input.netBrakeLoadLbf * input.effectiveRadiusFt;
}

/** Shaft horsepower from torque (lbf·ft) and speed (rpm): 2π·N·T / 33,000. */
export function brakeHorsepower(input: { torqueLbfFt: number; speedRpm: number }): number {
  return (2 * Math.PI * input.speedRpm * input.torqueLbfFt) / FT_LBF_PER_MIN_PER_HP;
}

/**
 * Receiver drop of a compound engine, psi: receiver pressure less the low-pressure cylinder's admission
 * pressure read from its card (both on the same basis, gauge or absolute).
 */
export function receiverDropPsi(input: { receiverPressurePsi: number; lpAdmissionPressurePsi: number }): number {
  return input.receiverPressurePsi - input.lpAdmissionPressurePsi;
}

/** Each cylinder's share of the total indicated work (fractions summing to 1). */
export function workShareByCylinder(
  cylinders: readonly { label: string; indicatedHorsepower: number }[],
): { label: string; share: number }[] {
  const total = cylinders.reduce((sum, c) => sum + c.indicatedHorsepower, 0);
  if (total === 0) throw new CalculationInputError(null, 'total indicated horsepower is zero; shares are undefined');
  return cylinders.map((c) => ({ label: c.label, share: c.indicatedHorsepower / total }));
}

// ---------------------------------------------------------------------------------------------
// POST /api/calculations/indicated-power
// ---------------------------------------------------------------------------------------------

export type CylinderEnd = 'head' | 'crank';

/** One card; gives exactly one of: MEP; area + length + spring; ordinates + spring. */
export interface IndicatorCardInput {
  end: CylinderEnd;
  meanEffectivePressurePsi?: number;
  areaSqIn?: number;
  lengthIn?: number;
  springPsiPerIn?: number;
  ordinatesIn?: number[];
}

export interface CylinderInput {
  label: string;
  boreIn: number;
  /** Piston rod diameter (passes through the crank-end cover), in; 0 if none. */
  pistonRodIn: number;
  /** Tail rod diameter (passes through the head-end cover), in; 0 if none. */
  tailRodIn: number;
  /** This cylinder's stroke where it differs from the engine's, in. */
  strokeIn?: number;
  cards: IndicatorCardInput[];
}

export interface IndicatedPowerInput {
  rpm: number;
  strokeIn: number;
  cylinders: CylinderInput[];
}

export interface EndResult {
  end: CylinderEnd;
  meanEffectivePressurePsi: number;
  effectiveAreaSqIn: number;
  indicatedHorsepower: number;
}

export interface CylinderResult {
  label: string;
  indicatedHorsepower: number;
  ends: EndResult[];
}

export interface IndicatedPowerResult {
  cylinders: CylinderResult[];
  /** Every end of every cylinder has a card. When false the totals are the sum of the cards present, not the engine's power. */
  complete: boolean;
  /** The ends without a card, by cylinder label. */
  missingEnds: { cylinderLabel: string; end: CylinderEnd }[];
  totalIndicatedHorsepower: number;
  totalIndicatedKilowatts: number;
  /**
   * Total work referred to the largest cylinder (greatest swept volume), psi; see module notes. Only for a complete
   * set (null otherwise, with the reason in referredMeanEffectivePressureMissing).
   */
  referredMeanEffectivePressurePsi: number | null;
  referredMeanEffectivePressureMissing: string | null;
}

/** Why a figure that needs every card is absent: names the missing ends. */
export function incompleteSetReason(missingEnds: readonly { cylinderLabel: string; end: CylinderEnd }[]): string {
  const words: Record<CylinderEnd, string> = { head: 'head end', crank: 'crank end' };
  return `needs a card from every end; missing: ${missingEnds.map((m) => `${m.cylinderLabel} ${words[m.end]}`).join(', ')}`;
}

const isGiven = (v: unknown) => v !== undefined && v !== null;

function requireNumber(value: unknown, path: string): number {
  if (typeof value !== 'number' || !Number.isFinite(value)) {
    throw new CalculationInputError(path, 'must be a finite number');
  }
  return value;
}

function requirePositiveNumber(value: unknown, path: string): number {
  const n = requireNumber(value, path);
  if (n <= 0) throw new CalculationInputError(path, 'must be greater than zero');
  return n;
}

function requireRod(value: unknown, boreIn: number, path: string): number {
  const n = requireNumber(value ?? 0, path);
  if (n < 0) throw new CalculationInputError(path, 'must not be negative (use 0 for no rod)');
  if (n >= boreIn) throw new CalculationInputError(path, 'must be smaller than the bore');
  return n;
}

/** Mean effective pressure of one card, validating that it gives exactly one way. */
function cardMeanEffectivePressurePsi(card: IndicatorCardInput, path: string): number {
  const ways: { field: keyof IndicatorCardInput; given: boolean }[] = [
    { field: 'meanEffectivePressurePsi', given: isGiven(card.meanEffectivePressurePsi) },
    { field: 'areaSqIn', given: isGiven(card.areaSqIn) },
    { field: 'ordinatesIn', given: isGiven(card.ordinatesIn) },
  ];
  const given = ways.filter((w) => w.given);
  if (given.length === 0) {
    throw new CalculationInputError(
      path,
      'give one of meanEffectivePressurePsi; areaSqIn with lengthIn and springPsiPerIn; ordinatesIn with springPsiPerIn',
    );
  }
  if (given.length > 1) {
    throw new CalculationInputError(
      `${path}.${String(given[1].field)}`,
      `a card gives only one way to its mean pressure, but ${given.map((w) => w.field).join(' and ')} were both given`,
    );
  }
  switch (given[0].field) {
    case 'meanEffectivePressurePsi':
      return requireNumber(card.meanEffectivePressurePsi, `${path}.meanEffectivePressurePsi`);
    case 'areaSqIn': {
      const areaSqIn = requireNumber(card.areaSqIn, `${path}.areaSqIn`);
      if (areaSqIn < 0) throw new CalculationInputError(`${path}.areaSqIn`, 'must not be negative');
      const lengthIn = requirePositiveNumber(card.lengthIn, `${path}.lengthIn`);
      const springPsiPerIn = requirePositiveNumber(card.springPsiPerIn, `${path}.springPsiPerIn`);
      return mepFromPlanimeter({ areaSqIn, lengthIn, springPsiPerIn }).meanEffectivePressurePsi;
    }
    default: {
      const ordinatesIn = card.ordinatesIn;
      if (!Array.isArray(ordinatesIn) || ordinatesIn.length < 2) {
        throw new CalculationInputError(`${path}.ordinatesIn`, 'needs at least two ordinates');
      }
      ordinatesIn.forEach((o, k) => requireNumber(o, `${path}.ordinatesIn[${k}]`));
      const springPsiPerIn = requirePositiveNumber(card.springPsiPerIn, `${path}.springPsiPerIn`);
      return mepFromOrdinates({ ordinatesIn, springPsiPerIn }).meanEffectivePressurePsi;
    }
  }
}

/**
 * Indicated power of a set of cards: per end, per cylinder, in total (hp and kW) and the mean
 * effective pressure referred to the largest cylinder. Ends without a card contribute nothing; they are listed
 * in missingEnds, `complete` is false, the totals are the sum of the cards present and the referred MEP is null.
 * Throws CalculationInputError for a card giving two ways or none, non-positive dimensions or speed,
 * a rod not smaller than its bore, or two cards for the same end of a cylinder.
 */
export function computeIndicatedPower(input: IndicatedPowerInput): IndicatedPowerResult {
  const speedRpm = requirePositiveNumber(input?.rpm, 'rpm');
  const engineStrokeIn = requirePositiveNumber(input.strokeIn, 'strokeIn');
  if (!Array.isArray(input.cylinders) || input.cylinders.length === 0) {
    throw new CalculationInputError('cylinders', 'needs at least one cylinder');
  }

  const geometry: { strokeIn: number; meanAreaSqIn: number }[] = [];
  const cylinders: CylinderResult[] = input.cylinders.map((cyl, i) => {
    const path = `cylinders[${i}]`;
    if (typeof cyl?.label !== 'string') throw new CalculationInputError(`${path}.label`, 'must be a string');
    const boreIn = requirePositiveNumber(cyl.boreIn, `${path}.boreIn`);
    const pistonRodIn = requireRod(cyl.pistonRodIn, boreIn, `${path}.pistonRodIn`);
    const tailRodIn = requireRod(cyl.tailRodIn, boreIn, `${path}.tailRodIn`);
    const strokeIn = isGiven(cyl.strokeIn) ? requirePositiveNumber(cyl.strokeIn, `${path}.strokeIn`) : engineStrokeIn;
    const areaByEnd: Record<CylinderEnd, number> = {
      head: effectiveAreaSqIn(boreIn, tailRodIn),
      crank: effectiveAreaSqIn(boreIn, pistonRodIn),
    };
    geometry.push({ strokeIn, meanAreaSqIn: (areaByEnd.head + areaByEnd.crank) / 2 });

    if (!Array.isArray(cyl.cards) || cyl.cards.length === 0) {
      throw new CalculationInputError(`${path}.cards`, 'needs at least one card');
    }
    const seen = new Set<CylinderEnd>();
    const ends: EndResult[] = cyl.cards.map((card, j) => {
      const cardPath = `${path}.cards[${j}]`;
      if (card?.end !== 'head' && card?.end !== 'crank') {
        throw new CalculationInputError(`${cardPath}.end`, "must be 'head' or 'crank'");
      }
      if (seen.has(card.end)) {
        throw new CalculationInputError(`${cardPath}.end`, `a second card for the ${card.end} end of this cylinder`);
      }
      seen.add(card.end);
      const meanEffectivePressurePsi = cardMeanEffectivePressurePsi(card, cardPath);
      const area = areaByEnd[card.end];
      return {
        end: card.end,
        meanEffectivePressurePsi,
        effectiveAreaSqIn: area,
        indicatedHorsepower: endIndicatedHorsepower({
          meanEffectivePressurePsi,
          strokeIn,
          effectiveAreaSqIn: area,
          speedRpm,
        }),
      };
    });
    return {
      label: cyl.label,
      indicatedHorsepower: ends.reduce((sum, e) => sum + e.indicatedHorsepower, 0),
      ends,
    };
  });

  const totalIndicatedHorsepower = cylinders.reduce((sum, c) => sum + c.indicatedHorsepower, 0);
  // The largest cylinder by swept volume (mean effective area × stroke).
  const largest = geometry.reduce((a, b) => (b.meanAreaSqIn * b.strokeIn > a.meanAreaSqIn * a.strokeIn ? b : a));
  // Horsepower the largest cylinder would give, both ends, per psi of mean pressure on its mean area.
  const largestHorsepowerPerPsi =
    2 *
    endIndicatedHorsepower({
      meanEffectivePressurePsi: 1,
      strokeIn: largest.strokeIn,
      effectiveAreaSqIn: largest.meanAreaSqIn,
      speedRpm,
    });
  const missingEnds = cylinders.flatMap((c) =>
    (['head', 'crank'] as const).filter((end) => !c.ends.some((e) => e.end === end)).map((end) => ({ cylinderLabel: c.label, end })),
  );
  const complete = missingEnds.length === 0;

  return {
    cylinders,
    complete,
    missingEnds,
    totalIndicatedHorsepower,
    totalIndicatedKilowatts: hpToKw(totalIndicatedHorsepower),
    referredMeanEffectivePressurePsi: complete ? totalIndicatedHorsepower / largestHorsepowerPerPsi : null,
    referredMeanEffectivePressureMissing: complete ? null : incompleteSetReason(missingEnds),
  };
}
