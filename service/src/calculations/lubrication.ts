/**
 * Lubrication calculations for plain (white-metal) journal bearings: oil viscosity against temperature,
 * bearing unit load, Petroff friction, Sommerfeld number, jacking / lift pressure and oil consumption.
 *
 * Pure functions. Units are in the names: journal geometry in inches, loads in lbf, viscosity in cSt,
 * Pa·s or reyn (lbf·s/in²), temperatures in °C or K.
 */
import { KPA_PER_PSI } from './units.js';
import { brakeHorsepower } from './indicated-power.js';
import { assertFinite, assertPositive, assertNonNegative } from './input-checks.js';
import { CalculationInputError } from './errors.js';

/** Offset between the Celsius and kelvin scales. */
export const KELVIN_OFFSET = 273.15;

/** 1 reyn = 1 lbf·s/in² = 6894.757 Pa·s (psi in pascals). */
export const PASCAL_SECONDS_PER_REYN = KPA_PER_PSI * 1000;

/** 1 cSt = 1 mm²/s = 1e-6 m²/s. */
const SQUARE_METRES_PER_SECOND_PER_CST = 1e-6;

/** Pounds in one short ton (2000 lb, definition). */
export const POUNDS_PER_SHORT_TON = 2000;

/** Volumetric thermal expansion of mineral oil used for density at temperature (common practice, no source). */
export const DEFAULT_OIL_EXPANSION_PER_K = 0.00065;
/** Density assumed when the data sheet gives none: a typical mineral oil at 15 °C (common practice, no source). */
export const DEFAULT_OIL_DENSITY_KG_M3_AT_15C = 880;
/** Reference temperature for oil density on data sheets. */
export const OIL_DENSITY_REFERENCE_C = 15;

export const JACKING_CAUTION =
  'Jacking and hydraulic lift of a loaded journal can kill or maim: a slipping jack, a burst hose or a ' +
  'shaft that drops will crush anything beneath it. Crib and pack under the load as it rises, never work ' +
  'under a load held only by hydraulics, and lock out the engine and barring gear first. These figures ' +
  'aid a qualified crew; they do not replace the jack and pump makers\u2019 ratings, local codes, the ' +
  'insurer\u2019s requirements or licensed practice.';

export const LIFT_PRESSURE_RULE_TEXT =
  'Lift pressure \u2248 load \u00f7 area of the oil pocket (or the projected journal area where there is ' +
  'no pocket). The pump is commonly rated at about 1.5\u20133 times that figure for breakaway, because ' +
  'the oil must first force its way under a journal resting metal-to-metal (common practice, no source).';

export const JACK_MARGIN_RULE_TEXT =
  'Jack capacity margin = total rated capacity of the jacks in use \u00f7 the load they carry; the ' +
  'default minimum is 1.5 (common practice, no source). Any jack that is not carrying its share ' +
  'reduces the real margin.';

export function celsiusToKelvin(temperatureC: number): number {
  return temperatureC + KELVIN_OFFSET;
}

// ---------------------------------------------------------------------------------------------
// Viscosity against temperature: ASTM D341 (Walther form)
// log10(log10(ν + 0.7)) = A − B·log10(T), ν in cSt, T in kelvin.
// ---------------------------------------------------------------------------------------------

export interface WaltherConstants {
  a: number;
  b: number;
}

function loglog(viscosityCst: number): number {
  return Math.log10(Math.log10(viscosityCst + 0.7));
}

/** Fit the ASTM D341 constants A and B through two (temperature K, viscosity cSt) points. */
export function waltherFit(p: {
  temperature1K: number;
  viscosity1Cst: number;
  temperature2K: number;
  viscosity2Cst: number;
}): WaltherConstants {
  assertPositive('temperature1K', p.temperature1K);
  assertPositive('temperature2K', p.temperature2K);
  assertPositive('viscosity1Cst', p.viscosity1Cst);
  assertPositive('viscosity2Cst', p.viscosity2Cst);
  if (p.temperature1K === p.temperature2K) throw new CalculationInputError(null, 'the two temperatures must differ');
  const b = (loglog(p.viscosity1Cst) - loglog(p.viscosity2Cst)) / (Math.log10(p.temperature2K) - Math.log10(p.temperature1K));
  const a = loglog(p.viscosity1Cst) + b * Math.log10(p.temperature1K);
  return { a, b };
}

/** Kinematic viscosity (cSt) at a temperature (K) from fitted ASTM D341 constants. */
export function waltherViscosityCst(constants: WaltherConstants, temperatureK: number): number {
  assertPositive('temperatureK', temperatureK);
  return 10 ** (10 ** (constants.a - constants.b * Math.log10(temperatureK))) - 0.7;
}

/** Kinematic viscosity (cSt) at temperatureC from the data-sheet figures at 40 °C and 100 °C. */
export function kinematicViscosityCst(p: { viscosity40cSt: number; viscosity100cSt: number; temperatureC: number }): number {
  const fit = waltherFit({
    temperature1K: celsiusToKelvin(40),
    viscosity1Cst: p.viscosity40cSt,
    temperature2K: celsiusToKelvin(100),
    viscosity2Cst: p.viscosity100cSt,
  });
  return waltherViscosityCst(fit, celsiusToKelvin(p.temperatureC));
}

/** ISO 3448 viscosity grades (mid-point kinematic viscosity at 40 °C in cSt). */
export const ISO_VG_GRADES = [2, 3, 5, 7, 10, 15, 22, 32, 46, 68, 100, 150, 220, 320, 460, 680, 1000, 1500, 2200, 3200] as const;

/**
 * ISO 3448 grade: the grade number is the mid-point kinematic viscosity at 40 °C in cSt and the
 * grade's limits are ±10 % of it.
 */
export function isoVgMidpointCst(grade: number): { midpointCst: number; minCst: number; maxCst: number } {
  if (!(ISO_VG_GRADES as readonly number[]).includes(grade)) {
    throw new CalculationInputError(null, `ISO VG ${grade} is not an ISO 3448 grade`);
  }
  return { midpointCst: grade, minCst: grade * 0.9, maxCst: grade * 1.1 };
}

/** Oil density at temperature: ρ(T) = ρ15 · (1 − α·(T − 15 °C)), α default 0.00065 /K (common practice). */
export function oilDensityKgM3(p: { densityKgM3At15C: number; temperatureC: number; expansionPerK?: number }): number {
  assertPositive('densityKgM3At15C', p.densityKgM3At15C);
  assertFinite('temperatureC', p.temperatureC);
  const alpha = p.expansionPerK ?? DEFAULT_OIL_EXPANSION_PER_K;
  assertNonNegative('expansionPerK', alpha);
  return p.densityKgM3At15C * (1 - alpha * (p.temperatureC - OIL_DENSITY_REFERENCE_C));
}

/** Dynamic (absolute) viscosity μ = ν·ρ in Pa·s from cSt and kg/m³. */
export function dynamicViscosityPaS(kinematicCst: number, densityKgM3: number): number {
  assertPositive('kinematicCst', kinematicCst);
  assertPositive('densityKgM3', densityKgM3);
  return kinematicCst * SQUARE_METRES_PER_SECOND_PER_CST * densityKgM3;
}

export function pascalSecondsToReyn(viscosityPaS: number): number {
  return viscosityPaS / PASCAL_SECONDS_PER_REYN;
}

export interface OilViscosityResult {
  kinematicCst: number;
  densityKgM3: number;
  /** true when no density was given and DEFAULT_OIL_DENSITY_KG_M3_AT_15C was used */
  densityAssumed: boolean;
  dynamicPaS: number;
  dynamicReyn: number;
}

/** Oil viscosity at running temperature from its 40 °C / 100 °C data-sheet figures. */
export function oilViscosity(p: {
  viscosity40cSt: number;
  viscosity100cSt: number;
  temperatureC: number;
  densityKgM3At15C?: number;
  expansionPerK?: number;
}): OilViscosityResult {
  const kinematicCst = kinematicViscosityCst(p);
  const densityAssumed = p.densityKgM3At15C === undefined;
  const densityKgM3 = oilDensityKgM3({
    densityKgM3At15C: p.densityKgM3At15C ?? DEFAULT_OIL_DENSITY_KG_M3_AT_15C,
    temperatureC: p.temperatureC,
    expansionPerK: p.expansionPerK,
  });
  const dynamicPaS = dynamicViscosityPaS(kinematicCst, densityKgM3);
  return { kinematicCst, densityKgM3, densityAssumed, dynamicPaS, dynamicReyn: pascalSecondsToReyn(dynamicPaS) };
}

// ---------------------------------------------------------------------------------------------
// Journal bearing: unit load, Petroff, Sommerfeld
// ---------------------------------------------------------------------------------------------

/** Bearing unit load P = W / (D·L) on the projected area, psi. */
export function bearingUnitLoadPsi(loadLbf: number, diameterIn: number, lengthIn: number): number {
  assertNonNegative('loadLbf', loadLbf);
  assertPositive('diameterIn', diameterIn);
  assertPositive('lengthIn', lengthIn);
  return loadLbf / (diameterIn * lengthIn);
}

/** Petroff friction torque T = 4π²·μ·N·r³·l / c (lbf·in) with μ in reyn and N in rev/s. */
export function petroffTorqueLbfIn(p: {
  radiusIn: number;
  lengthIn: number;
  radialClearanceIn: number;
  viscosityReyn: number;
  speedRevPerS: number;
}): number {
  assertPositive('radiusIn', p.radiusIn);
  assertPositive('lengthIn', p.lengthIn);
  assertPositive('radialClearanceIn', p.radialClearanceIn);
  assertPositive('viscosityReyn', p.viscosityReyn);
  assertNonNegative('speedRevPerS', p.speedRevPerS);
  return (4 * Math.PI ** 2 * p.viscosityReyn * p.speedRevPerS * p.radiusIn ** 3 * p.lengthIn) / p.radialClearanceIn;
}

/** Sommerfeld number S = (r/c)²·μN/P (dimensionless; μ reyn, N rev/s, P psi). */
export function sommerfeldNumber(p: {
  radiusIn: number;
  radialClearanceIn: number;
  viscosityReyn: number;
  speedRevPerS: number;
  unitLoadPsi: number;
}): number {
  assertPositive('radiusIn', p.radiusIn);
  assertPositive('radialClearanceIn', p.radialClearanceIn);
  assertPositive('viscosityReyn', p.viscosityReyn);
  assertNonNegative('speedRevPerS', p.speedRevPerS);
  assertPositive('unitLoadPsi', p.unitLoadPsi);
  return (p.radiusIn / p.radialClearanceIn) ** 2 * ((p.viscosityReyn * p.speedRevPerS) / p.unitLoadPsi);
}

/** Petroff friction coefficient f = 2π²·(μN/P)·(r/c) = 2π²·S·(c/r). */
export function petroffFrictionCoefficient(p: {
  radiusIn: number;
  radialClearanceIn: number;
  viscosityReyn: number;
  speedRevPerS: number;
  unitLoadPsi: number;
}): number {
  return 2 * Math.PI ** 2 * sommerfeldNumber(p) * (p.radialClearanceIn / p.radiusIn);
}

/** Power (hp) absorbed by a torque in lbf·in at a speed in rpm (2πNT/33,000 via brakeHorsepower, T in lbf·ft). */
export function torqueLbfInToHp(torqueLbfIn: number, speedRpm: number): number {
  assertFinite('torqueLbfIn', torqueLbfIn);
  assertNonNegative('speedRpm', speedRpm);
  return brakeHorsepower({ torqueLbfFt: torqueLbfIn / 12, speedRpm });
}

export interface JournalFrictionInput {
  diameterIn: number;
  lengthIn: number;
  radialClearanceIn: number;
  speedRpm: number;
  viscosityReyn: number;
  loadLbf: number;
}
export interface JournalFrictionResult {
  frictionTorqueLbfIn: number;
  frictionCoefficient: number;
  powerLossHp: number;
  sommerfeldNumber: number;
  unitLoadPsi: number;
}

/**
 * Friction in a lightly loaded, concentric journal bearing by Petroff's equation. Petroff ignores
 * eccentricity, so at low Sommerfeld numbers (heavily loaded, slow journals) the real friction is higher;
 * treat the result as the lower bound a bearing chart approaches asymptotically.
 */
export function journalFriction(input: JournalFrictionInput): JournalFrictionResult {
  const radiusIn = input.diameterIn / 2;
  const speedRevPerS = input.speedRpm / 60;
  assertPositive('loadLbf', input.loadLbf);
  const unitLoadPsi = bearingUnitLoadPsi(input.loadLbf, input.diameterIn, input.lengthIn);
  const frictionTorqueLbfIn = petroffTorqueLbfIn({
    radiusIn,
    lengthIn: input.lengthIn,
    radialClearanceIn: input.radialClearanceIn,
    viscosityReyn: input.viscosityReyn,
    speedRevPerS,
  });
  const common = {
    radiusIn,
    radialClearanceIn: input.radialClearanceIn,
    viscosityReyn: input.viscosityReyn,
    speedRevPerS,
    unitLoadPsi,
  };
  return {
    frictionTorqueLbfIn,
    frictionCoefficient: petroffFrictionCoefficient(common),
    powerLossHp: torqueLbfInToHp(frictionTorqueLbfIn, input.speedRpm),
    sommerfeldNumber: sommerfeldNumber(common),
    unitLoadPsi,
  };
}

// ---------------------------------------------------------------------------------------------
// Jacking / hydraulic lift
// ---------------------------------------------------------------------------------------------

export const DEFAULT_BREAKAWAY_FACTOR = 2;
export const BREAKAWAY_FACTOR_RANGE = { min: 1.5, max: 3 } as const;

/** Oil pressure needed to lift a journal (see LIFT_PRESSURE_RULE_TEXT; common practice, no source). */
export function liftPressure(p: { loadLbf: number; pocketAreaIn2: number; breakawayFactor?: number }): {
  liftPressurePsi: number;
  pumpPressurePsi: number;
  breakawayFactor: number;
  pumpPressureRangePsi: { min: number; max: number };
} {
  assertPositive('loadLbf', p.loadLbf);
  assertPositive('pocketAreaIn2', p.pocketAreaIn2);
  const breakawayFactor = p.breakawayFactor ?? DEFAULT_BREAKAWAY_FACTOR;
  assertFinite('breakawayFactor', breakawayFactor);
  if (breakawayFactor < 1) throw new CalculationInputError(null, 'breakawayFactor must be at least 1');
  const liftPressurePsi = p.loadLbf / p.pocketAreaIn2;
  return {
    liftPressurePsi,
    pumpPressurePsi: liftPressurePsi * breakawayFactor,
    breakawayFactor,
    pumpPressureRangePsi: {
      min: liftPressurePsi * BREAKAWAY_FACTOR_RANGE.min,
      max: liftPressurePsi * BREAKAWAY_FACTOR_RANGE.max,
    },
  };
}

export const DEFAULT_REQUIRED_JACK_MARGIN = 1.5;

/** Jack capacity margin check (see JACK_MARGIN_RULE_TEXT; common practice, no source). */
export function jackCapacityCheck(p: { jackCount: number; jackCapacityShortTons: number; loadLbf: number; requiredMargin?: number }): {
  capacityShortTons: number;
  loadShortTons: number;
  margin: number;
  requiredMargin: number;
  belowRequiredMargin: boolean;
} {
  assertPositive('jackCapacityShortTons', p.jackCapacityShortTons);
  assertPositive('loadLbf', p.loadLbf);
  if (!Number.isInteger(p.jackCount) || p.jackCount < 1) throw new CalculationInputError(null, 'jackCount must be a positive integer');
  const requiredMargin = p.requiredMargin ?? DEFAULT_REQUIRED_JACK_MARGIN;
  assertPositive('requiredMargin', requiredMargin);
  const capacityShortTons = p.jackCount * p.jackCapacityShortTons;
  const loadShortTons = p.loadLbf / POUNDS_PER_SHORT_TON;
  const margin = capacityShortTons / loadShortTons;
  return { capacityShortTons, loadShortTons, margin, requiredMargin, belowRequiredMargin: margin < requiredMargin };
}

// ---------------------------------------------------------------------------------------------
// Oil consumption
// ---------------------------------------------------------------------------------------------

/** Revolutions in a run from an average speed and a duration. */
export function revolutionsFromSpeed(averageSpeedRpm: number, runHours: number): number {
  assertNonNegative('averageSpeedRpm', averageSpeedRpm);
  assertNonNegative('runHours', runHours);
  return averageSpeedRpm * 60 * runHours;
}

/** Oil used per run-hour and per thousand revolutions (same volume unit as the input). */
export function oilConsumption(p: { oilUsedLitres: number; runHours: number; revolutions: number }): {
  litresPerRunHour: number;
  litresPerThousandRevolutions: number;
} {
  assertNonNegative('oilUsedLitres', p.oilUsedLitres);
  assertPositive('runHours', p.runHours);
  assertPositive('revolutions', p.revolutions);
  return {
    litresPerRunHour: p.oilUsedLitres / p.runHours,
    litresPerThousandRevolutions: (p.oilUsedLitres / p.revolutions) * 1000,
  };
}

/** Within ± this percentage of the earlier mean, consumption is called steady (common practice, no source). */
export const DEFAULT_CONSUMPTION_STEADY_PERCENT = 15;

export const CONSUMPTION_TREND_RULE_TEXT =
  'Trend: the latest run\u2019s oil used per thousand revolutions against the median of the runs before it ' +
  '(the median, so one odd run does not move the yardstick). ' +
  'Within \u00b115 % it is steady; above, rising (look for a leak, a worn bearing or a lubricator set too rich); ' +
  'below, falling (look for a choked feed). Common practice, no source.';

/**
 * Trend of a lubrication point's consumption: the latest figure against the median of the earlier ones
 * (figures oldest first, e.g. litres per thousand revolutions per run).
 */
export function consumptionTrend(
  figuresOldestFirst: number[],
  options: { steadyPercent?: number } = {},
): {
  latest: number | null;
  earlierMedian: number | null;
  changePercent: number | null;
  direction: 'rising' | 'steady' | 'falling' | null;
} {
  const steady = options.steadyPercent ?? DEFAULT_CONSUMPTION_STEADY_PERCENT;
  assertNonNegative('steadyPercent', steady);
  for (const f of figuresOldestFirst) assertNonNegative('figure', f);
  if (figuresOldestFirst.length === 0) return { latest: null, earlierMedian: null, changePercent: null, direction: null };
  const latest = figuresOldestFirst[figuresOldestFirst.length - 1];
  const earlier = figuresOldestFirst.slice(0, -1).sort((a, b) => a - b);
  if (earlier.length === 0) return { latest, earlierMedian: null, changePercent: null, direction: null };
  const mid = Math.floor(earlier.length / 2);
  const earlierMedian = earlier.length % 2 ? earlier[mid] : (earlier[mid - 1] + earlier[mid]) / 2;
  if (earlierMedian === 0) return { latest, earlierMedian, changePercent: null, direction: latest > 0 ? 'rising' : 'steady' };
  const changePercent = ((latest - earlierMedian) / earlierMedian) * 100;
  const direction = changePercent > steady ? 'rising' : changePercent < -steady ? 'falling' : 'steady';
  return { latest, earlierMedian, changePercent, direction };
}
