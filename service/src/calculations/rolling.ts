/**
 * Flat / bar rolling, one pass: geometry, strain, strain rate, mean flow stress, roll force, torque and power.
 *
 * Model (simple slab estimate, as taught in manufacturing texts):
 *   draft Δh = h0 − h1, reduction r = Δh/h0, true strain ε = ln(h0/h1)
 *   elongation (area ratio) λ = (h0·w0)/(h1·w1)
 *   contact length L = √(R·Δh)
 *   mean strain rate ε̇ = (v/L)·ε, v = roll surface speed (the average rate over the time a particle
 *     spends in the roll gap, L/v)
 *   roll force F = L·w·Y_avg × frictionFactor (w = mean of entry and exit width; frictionFactor 1 is the
 *     frictionless estimate, about 1.2 allows for friction)
 *   torque per roll = F·L/2 (force taken to act at the middle of the arc of contact)
 *   power for the roll pair P = 2π·F·L·N/60 (W, with F in N, L in m, N in rpm)
 *
 * Mean flow stress, hot carbon steel: Misaka & Yoshimoto (1967),
 *   σ = exp(0.126 − 1.75C + 0.594C² + (2851 + 2968C − 1120C²)/T) · ε^0.21 · ε̇^0.13  [kgf/mm²]
 *   with C in wt %, T in kelvin; ×9.80665 gives MPa. Reported range: ε ≤ 0.5, 750–1200 °C,
 *   ε̇ 30–200 /s, C ≤ 1.2 %. A slow bar mill often runs below that strain-rate range: the result is
 *   then an extrapolation and is flagged.
 * Mean flow stress, cold / annealed metal with a power-law flow curve σ = K·εⁿ: Y_avg = K·εⁿ/(1 + n).
 */
import { WATTS_PER_HP } from './units.js';
import { celsiusToKelvin } from './lubrication.js';
import { rpmToRadPerS } from './flywheel.js';
import { assertFinite, assertPositive, assertNonNegative } from './input-checks.js';
import { CalculationInputError } from './errors.js';

/** 1 lbf in newtons (exact: 0.45359237 kg × 9.80665 m/s²). */
export const NEWTONS_PER_LBF = 4.4482216152605;
/** 1 ft in metres (exact). */
export const METRES_PER_FOOT = 0.3048;
/** 1 kgf/mm² in MPa (standard gravity 9.80665 m/s²). */
export const MPA_PER_KGF_PER_MM2 = 9.80665;

export const MISAKA_VALID_RANGE = {
  strainMax: 0.5,
  temperatureMinC: 750,
  temperatureMaxC: 1200,
  strainRateMinPerS: 30,
  strainRateMaxPerS: 200,
  carbonMaxPct: 1.2,
} as const;

/** Allowance on the frictionless roll force for friction (about 20 %, per the manufacturing texts). */
export const TYPICAL_FRICTION_FACTOR = 1.2;

/**
 * Coefficient of friction between hot steel and iron or steel rolls used for the bite check, unless the user gives
 * another. Hot rolling runs with high friction (the texts give roughly 0.2 to sticking, ~0.7); 0.3 is a cautious middle
 * figure (from memory, S. Kalpakjian & S. R. Schmid, Manufacturing Engineering and Technology, section on flat rolling).
 */
export const HOT_ROLLING_FRICTION_COEFFICIENT = 0.3;

/** Von Mises plane-strain constraint on the uniaxial flow stress: 2/√3 (common practice, no source). */
export const PLANE_STRAIN_FACTOR = 2 / Math.sqrt(3);

/**
 * The largest draft the rolls can bite without help: Δh_max = μ²·R (Kalpakjian & Schmid, Manufacturing Engineering
 * and Technology, flat rolling, "maximum draft"; from memory). Answers whether a draft is bitten.
 */
export function biteCheck(p: { rollDiameterMm: number; draftMm: number; frictionCoefficient: number }): {
  maxDraftMm: number;
  bites: boolean;
} {
  assertPositive('rollDiameterMm', p.rollDiameterMm);
  assertNonNegative('draftMm', p.draftMm);
  assertPositive('frictionCoefficient', p.frictionCoefficient);
  if (p.frictionCoefficient > 1) throw new CalculationInputError('frictionCoefficient', 'must be at most 1');
  const maxDraftMm = p.frictionCoefficient ** 2 * (p.rollDiameterMm / 2);
  return { maxDraftMm, bites: p.draftMm <= maxDraftMm };
}

/**
 * Geometry factor on the plane-strain flow stress for the mean roll pressure, from the shape of the roll gap
 * Δ = mean height / contact length (from memory, W. F. Hosford & R. M. Caddell, Metal Forming: Mechanics and
 * Metallurgy, chapter on flat rolling; no page seen):
 *   thin gap (L ≥ h̄): Q = 1 + μ·L/(4·h̄), the friction hill of a slab analysis;
 *   thick gap (L < h̄): Q = 0.8 + 0.2·h̄/L, the inhomogeneous deformation of a thick bar.
 */
export function rollGapGeometryFactor(p: { contactLengthMm: number; meanHeightMm: number; frictionCoefficient: number }): number {
  assertPositive('contactLengthMm', p.contactLengthMm);
  assertPositive('meanHeightMm', p.meanHeightMm);
  assertNonNegative('frictionCoefficient', p.frictionCoefficient);
  const ratio = p.contactLengthMm / p.meanHeightMm;
  return ratio >= 1 ? 1 + (p.frictionCoefficient * ratio) / 4 : 0.8 + 0.2 / ratio;
}

export const MILL_LOAD_CAUTION =
  'Roll force, torque and power here are estimates from a simple model. A stand loaded past its rating can ' +
  'break a roll, a neck or a housing, and hot stock can kill. Keep within the stand and engine ratings, ' +
  'and treat these figures as an aid to a qualified crew, never a replacement for the mill\u2019s own limits, ' +
  'local codes or licensed practice.';

export interface PassGeometry {
  draftMm: number;
  reduction: number;
  trueStrain: number;
  elongation: number;
  contactLengthMm: number;
  meanWidthMm: number;
}

export function passGeometry(p: {
  rollDiameterMm: number;
  entryThicknessMm: number;
  exitThicknessMm: number;
  entryWidthMm: number;
  exitWidthMm?: number;
}): PassGeometry {
  assertPositive('rollDiameterMm', p.rollDiameterMm);
  assertPositive('entryThicknessMm', p.entryThicknessMm);
  assertPositive('exitThicknessMm', p.exitThicknessMm);
  assertPositive('entryWidthMm', p.entryWidthMm);
  const exitWidthMm = p.exitWidthMm ?? p.entryWidthMm;
  assertPositive('exitWidthMm', exitWidthMm);
  if (p.exitThicknessMm >= p.entryThicknessMm)
    throw new CalculationInputError(
      null,
      'exitThicknessMm must be less than entryThicknessMm',
      'The exit height must be less than the entry height: a pass has to reduce the bar (turn the bar, or check the sizes).',
    );
  const draftMm = p.entryThicknessMm - p.exitThicknessMm;
  const rollRadiusMm = p.rollDiameterMm / 2;
  return {
    draftMm,
    reduction: draftMm / p.entryThicknessMm,
    trueStrain: Math.log(p.entryThicknessMm / p.exitThicknessMm),
    elongation: areaElongation(p.entryThicknessMm * p.entryWidthMm, p.exitThicknessMm * exitWidthMm),
    contactLengthMm: Math.sqrt(rollRadiusMm * draftMm),
    meanWidthMm: (p.entryWidthMm + exitWidthMm) / 2,
  };
}

export type SectionShape = 'rectangle' | 'round' | 'oval';
/** A bar's cross-section: rectangle (flat or square, box passes), round (height = width = diameter), oval. */
export interface BarSection {
  shape: SectionShape;
  heightMm: number;
  widthMm: number;
}

/**
 * Cross-section area, mm²: rectangle h·w; round and oval as an ellipse π·h·w/4 (a round has h = w = d, so
 * π·d²/4). A groove oval made of two arcs is a little fuller than an ellipse; the ellipse is the simple estimate.
 */
export function sectionAreaMm2(s: BarSection): number {
  assertPositive('heightMm', s.heightMm);
  assertPositive('widthMm', s.widthMm);
  if (s.shape === 'rectangle') return s.heightMm * s.widthMm;
  if (s.shape === 'round' || s.shape === 'oval') return (Math.PI * s.heightMm * s.widthMm) / 4;
  throw new CalculationInputError(null, `shape must be rectangle, round or oval`);
}

/** Elongation (coefficient of elongation) of a pass: entry area / exit area (constant volume). */
export function areaElongation(entryAreaMm2: number, exitAreaMm2: number): number {
  assertPositive('entryAreaMm2', entryAreaMm2);
  assertPositive('exitAreaMm2', exitAreaMm2);
  return entryAreaMm2 / exitAreaMm2;
}

/** Length of a bar of stock (length, area) once rolled to a section of exitAreaMm2 (constant volume), m. */
export function barLengthM(stockLengthM: number, stockAreaMm2: number, exitAreaMm2: number): number {
  assertPositive('stockLengthM', stockLengthM);
  return stockLengthM * areaElongation(stockAreaMm2, exitAreaMm2);
}

/** Roll surface speed v = ω·D/2 = π·D·N/60, m/s. */
export function rollSurfaceSpeedMPerS(rollDiameterMm: number, rollSpeedRpm: number): number {
  assertPositive('rollDiameterMm', rollDiameterMm);
  assertNonNegative('rollSpeedRpm', rollSpeedRpm);
  return rpmToRadPerS(rollSpeedRpm) * (rollDiameterMm / 1000 / 2);
}

/** Mean strain rate ε̇ = (v/L)·ε, per second. */
export function meanStrainRatePerS(p: { rollSurfaceSpeedMPerS: number; contactLengthMm: number; trueStrain: number }): number {
  assertNonNegative('rollSurfaceSpeedMPerS', p.rollSurfaceSpeedMPerS);
  assertPositive('contactLengthMm', p.contactLengthMm);
  assertNonNegative('trueStrain', p.trueStrain);
  return (p.rollSurfaceSpeedMPerS / (p.contactLengthMm / 1000)) * p.trueStrain;
}

export interface MisakaResult {
  flowStressMPa: number;
  /** parameters outside the range the equation was fitted over */
  outOfRange: string[];
}

/** Misaka & Yoshimoto mean flow stress of plain carbon steel, MPa (see the module header). */
export function misakaMeanFlowStressMPa(p: {
  carbonPct: number;
  temperatureC: number;
  strain: number;
  strainRatePerS: number;
}): MisakaResult {
  assertNonNegative('carbonPct', p.carbonPct);
  assertFinite('temperatureC', p.temperatureC);
  assertPositive('strain', p.strain);
  assertPositive('strainRatePerS', p.strainRatePerS);
  const c = p.carbonPct;
  const temperatureK = celsiusToKelvin(p.temperatureC);
  if (temperatureK <= 0) throw new CalculationInputError(null, 'temperatureC must be above absolute zero');
  const exponent = 0.126 - 1.75 * c + 0.594 * c ** 2 + (2851 + 2968 * c - 1120 * c ** 2) / temperatureK;
  const kgfPerMm2 = Math.exp(exponent) * p.strain ** 0.21 * p.strainRatePerS ** 0.13;
  const r = MISAKA_VALID_RANGE;
  const outOfRange: string[] = [];
  if (p.strain > r.strainMax) outOfRange.push(`strain ${p.strain.toFixed(3)} > ${r.strainMax}`);
  if (p.temperatureC < r.temperatureMinC || p.temperatureC > r.temperatureMaxC) {
    outOfRange.push(`temperature ${p.temperatureC} °C outside ${r.temperatureMinC}–${r.temperatureMaxC} °C`);
  }
  if (p.strainRatePerS < r.strainRateMinPerS || p.strainRatePerS > r.strainRateMaxPerS) {
    outOfRange.push(`strain rate ${p.strainRatePerS.toFixed(2)} /s outside ${r.strainRateMinPerS}–${r.strainRateMaxPerS} /s`);
  }
  if (c > r.carbonMaxPct) outOfRange.push(`carbon ${c} % > ${r.carbonMaxPct} %`);
  return { flowStressMPa: kgfPerMm2 * MPA_PER_KGF_PER_MM2, outOfRange };
}

/** Mean flow stress over a pass for a power-law flow curve σ = K·εⁿ: Y_avg = K·εⁿ/(1 + n), MPa. */
export function powerLawMeanFlowStressMPa(p: { strengthCoefficientMPa: number; hardeningExponent: number; strain: number }): number {
  assertPositive('strengthCoefficientMPa', p.strengthCoefficientMPa);
  assertNonNegative('hardeningExponent', p.hardeningExponent);
  assertNonNegative('strain', p.strain);
  return (p.strengthCoefficientMPa * p.strain ** p.hardeningExponent) / (1 + p.hardeningExponent);
}

export interface RollLoad {
  forceN: number;
  forceKn: number;
  forceLbf: number;
  torquePerRollNm: number;
  torquePerRollKnM: number;
  torquePerRollLbfFt: number;
  powerRollPairW: number;
  powerRollPairKw: number;
  powerRollPairHp: number;
}

/** Roll force, torque per roll and power for the roll pair (see the module header). */
export function rollLoad(p: {
  contactLengthMm: number;
  widthMm: number;
  meanFlowStressMPa: number;
  rollSpeedRpm: number;
  frictionFactor?: number;
  /** a factor on the flow stress given directly (plane strain × geometry), used instead of frictionFactor */
  forceFactor?: number;
}): RollLoad {
  assertPositive('contactLengthMm', p.contactLengthMm);
  assertPositive('widthMm', p.widthMm);
  assertPositive('meanFlowStressMPa', p.meanFlowStressMPa);
  assertNonNegative('rollSpeedRpm', p.rollSpeedRpm);
  const frictionFactor = p.forceFactor ?? p.frictionFactor ?? 1;
  assertFinite('frictionFactor', frictionFactor);
  if (p.forceFactor === undefined && frictionFactor < 1) throw new CalculationInputError(null, 'frictionFactor must be at least 1');
  if (p.forceFactor !== undefined) assertPositive('forceFactor', p.forceFactor);
  const contactLengthM = p.contactLengthMm / 1000;
  // MPa × mm² = N
  const forceN = p.contactLengthMm * p.widthMm * p.meanFlowStressMPa * frictionFactor;
  const torquePerRollNm = (forceN * contactLengthM) / 2;
  // two rolls × torque × ω = 2π·F·L·N/60
  const powerRollPairW = 2 * torquePerRollNm * rpmToRadPerS(p.rollSpeedRpm);
  return {
    forceN,
    forceKn: forceN / 1000,
    forceLbf: forceN / NEWTONS_PER_LBF,
    torquePerRollNm,
    torquePerRollKnM: torquePerRollNm / 1000,
    torquePerRollLbfFt: torquePerRollNm / (NEWTONS_PER_LBF * METRES_PER_FOOT),
    powerRollPairW,
    powerRollPairKw: powerRollPairW / 1000,
    powerRollPairHp: powerRollPairW / WATTS_PER_HP,
  };
}

export interface PassLoadInput {
  rollDiameterMm: number;
  entryWidthMm: number;
  exitWidthMm?: number;
  entryThicknessMm: number;
  exitThicknessMm: number;
  /** stock temperature for the hot-steel flow stress */
  temperatureC: number;
  carbonPct: number;
  rollSpeedRpm: number;
  standMaxForceKn: number;
  /** 1 = frictionless estimate; TYPICAL_FRICTION_FACTOR (1.2) allows for friction */
  frictionFactor?: number;
  /** overrides the Misaka flow stress (e.g. a power-law figure for cold metal, or a measured value) */
  meanFlowStressMPa?: number;
  /** true strain of the pass where the heights alone do not give it (grooved passes: ln of the area ratio) */
  trueStrain?: number;
  /** roll–stock friction coefficient for the bite check and the geometry factor; default HOT_ROLLING_FRICTION_COEFFICIENT */
  frictionCoefficient?: number;
  /**
   * 'simple' (default): F = L·w·σ̄·frictionFactor. 'plane_strain': F = L·w·(2/√3)·σ̄·Q with Q the roll-gap geometry
   * factor (rollGapGeometryFactor); frictionFactor is then not used.
   */
  forceModel?: RollForceModel;
}

export type RollForceModel = 'simple' | 'plane_strain';

export interface PassLoadResult extends PassGeometry, RollLoad {
  rollSurfaceSpeedMPerS: number;
  meanStrainRatePerS: number;
  meanFlowStressMPa: number;
  flowStressSource: 'misaka' | 'given';
  flowStressOutOfRange: string[];
  exceedsStandForce: boolean;
  standForceUtilisation: number;
  /** the friction coefficient the bite check (and a plane-strain force) used */
  frictionCoefficient: number;
  /** Δh_max = μ²·R */
  maxBiteDraftMm: number;
  bites: boolean;
  forceModel: RollForceModel;
  /** the factor on the flow stress the force used: frictionFactor (simple) or (2/√3)·Q (plane strain) */
  forceFactor: number;
  /** Q, only for the plane-strain model */
  geometryFactor: number | null;
  /** which model each figure used, in words */
  models: { strain: string; flowStress: string; force: string; bite: string };
}

/** Everything for one pass, with a check against the stand's rated force. */
export function passLoad(input: PassLoadInput): PassLoadResult {
  assertPositive('standMaxForceKn', input.standMaxForceKn);
  const heightGeometry = passGeometry(input);
  if (input.trueStrain !== undefined) assertPositive('trueStrain', input.trueStrain);
  const geometry = input.trueStrain !== undefined ? { ...heightGeometry, trueStrain: input.trueStrain } : heightGeometry;
  const frictionCoefficient = input.frictionCoefficient ?? HOT_ROLLING_FRICTION_COEFFICIENT;
  const bite = biteCheck({ rollDiameterMm: input.rollDiameterMm, draftMm: geometry.draftMm, frictionCoefficient });
  const surfaceSpeed = rollSurfaceSpeedMPerS(input.rollDiameterMm, input.rollSpeedRpm);
  const strainRate = meanStrainRatePerS({
    rollSurfaceSpeedMPerS: surfaceSpeed,
    contactLengthMm: geometry.contactLengthMm,
    trueStrain: geometry.trueStrain,
  });
  let meanFlowStressMPa: number;
  let flowStressSource: 'misaka' | 'given';
  let flowStressOutOfRange: string[] = [];
  if (input.meanFlowStressMPa !== undefined) {
    assertPositive('meanFlowStressMPa', input.meanFlowStressMPa);
    meanFlowStressMPa = input.meanFlowStressMPa;
    flowStressSource = 'given';
  } else {
    if (input.temperatureC < MISAKA_VALID_RANGE.temperatureMinC) {
      throw new CalculationInputError(
        'temperatureC',
        `${input.temperatureC} °C is below ${MISAKA_VALID_RANGE.temperatureMinC} °C, the lowest temperature the hot flow-stress ` +
          `equation (Misaka & Yoshimoto) was fitted at (${MISAKA_VALID_RANGE.temperatureMinC}–${MISAKA_VALID_RANGE.temperatureMaxC} °C); ` +
          'give meanFlowStressMPa for cold or warm metal',
      );
    }
    const m = misakaMeanFlowStressMPa({
      carbonPct: input.carbonPct,
      temperatureC: input.temperatureC,
      strain: geometry.trueStrain,
      strainRatePerS: strainRate,
    });
    meanFlowStressMPa = m.flowStressMPa;
    flowStressSource = 'misaka';
    flowStressOutOfRange = m.outOfRange;
  }
  const forceModel: RollForceModel = input.forceModel ?? 'simple';
  let geometryFactor: number | null = null;
  let forceFactor = input.frictionFactor ?? 1;
  if (forceModel === 'plane_strain') {
    geometryFactor = rollGapGeometryFactor({
      contactLengthMm: geometry.contactLengthMm,
      meanHeightMm: (input.entryThicknessMm + input.exitThicknessMm) / 2,
      frictionCoefficient,
    });
    forceFactor = PLANE_STRAIN_FACTOR * geometryFactor;
  }
  const load = rollLoad({
    contactLengthMm: geometry.contactLengthMm,
    widthMm: geometry.meanWidthMm,
    meanFlowStressMPa,
    rollSpeedRpm: input.rollSpeedRpm,
    frictionFactor: forceModel === 'plane_strain' ? undefined : input.frictionFactor,
    forceFactor: forceModel === 'plane_strain' ? forceFactor : undefined,
  });
  const models = {
    strain: input.trueStrain !== undefined ? 'ln(entry area / exit area), grooved pass' : 'ln(entry height / exit height), flat pass',
    flowStress: flowStressSource === 'misaka' ? 'Misaka & Yoshimoto hot flow stress' : 'mean flow stress given',
    force:
      forceModel === 'plane_strain'
        ? `L·w·(2/√3)·σ̄·Q, plane strain with the roll-gap geometry factor Q = ${geometryFactor!.toFixed(3)} (μ = ${frictionCoefficient})`
        : `L·w·σ̄ × friction factor ${forceFactor}, simple slab estimate`,
    bite: `Δh ≤ μ²·R with μ = ${frictionCoefficient}`,
  };
  return {
    ...geometry,
    ...load,
    frictionCoefficient,
    maxBiteDraftMm: bite.maxDraftMm,
    bites: bite.bites,
    forceModel,
    forceFactor,
    geometryFactor,
    models,
    rollSurfaceSpeedMPerS: surfaceSpeed,
    meanStrainRatePerS: strainRate,
    meanFlowStressMPa,
    flowStressSource,
    flowStressOutOfRange,
    exceedsStandForce: load.forceKn > input.standMaxForceKn,
    standForceUtilisation: load.forceKn / input.standMaxForceKn,
  };
}
