/**
 * Saturated steam from the IAPWS Industrial Formulation 1997 (IAPWS Release R7-97(2012), an open
 * standard), and the steam accounted for by an indicator diagram.
 *
 *  - Region 4 (saturation line): saturation pressure from temperature (eq. 30) and saturation
 *    temperature from pressure (eq. 31), coefficients n1…n10 of Table 34.
 *  - Region 2 (vapour): specific volume from the dimensionless Gibbs free energy, eq. 15 with the
 *    ideal-gas part (γ°_π = 1/π) and the residual part of Table 11 (43 terms):
 *       v = (R·T/p) · π · (γ°_π + γʳ_π),   γʳ_π = Σ nᵢ·Iᵢ·π^(Iᵢ−1)·(τ − 0.5)^Jᵢ,   π = p/1 MPa, τ = 540 K/T.
 *    On the saturation line this gives v_g, dry saturated vapour, up to 623.15 K (16.529 MPa).
 *
 * SI inside (K, MPa, m³/kg); imperial wrappers (°F, psia, ft³/lb) for the crew's units.
 */
import { KPA_PER_PSI, celsiusToFahrenheit, fahrenheitToCelsius } from './units.js';
import { CalculationInputError } from './errors.js';

/** Caution shown beside steam-property figures. */
export const STEAM_PROPERTIES_CAUTION =
  'Steam-table figures aid a qualified crew in reading cards and tests; they are not a boiler or pipework ' +
  'rating. Working pressures follow the boiler certificate, local codes and licensed practice.';

/** Specific gas constant of water in IF97, kJ/(kg·K). */
const R_KJ_PER_KG_K = 0.461526;
const KELVIN_AT_0_C = 273.15;
/** Exact definitions: 1 lb = 0.45359237 kg, 1 ft = 0.3048 m. */
const KG_PER_LB = 0.45359237;
const M_PER_FT = 0.3048;
/** 1 m³/kg in ft³/lb. */
export const FT3_PER_LB_PER_M3_PER_KG = KG_PER_LB / (M_PER_FT * M_PER_FT * M_PER_FT);
const MPA_PER_PSI = KPA_PER_PSI / 1000;

/** Validity of the region 4 equations. */
export const SATURATION_TEMPERATURE_MIN_K = 273.15;
export const CRITICAL_TEMPERATURE_K = 647.096;
export const CRITICAL_PRESSURE_MPA = 22.064;
/** Saturation pressure at 273.15 K (release, section 8.1). */
export const SATURATION_PRESSURE_MIN_MPA = 611.213e-6;
/** Region 2 meets region 3 on the saturation line at 623.15 K. */
export const REGION2_SATURATION_TEMPERATURE_MAX_K = 623.15;

// Table 34: coefficients of the saturation equations 30 and 31.
const N4 = [
  0.11670521452767e4, -0.72421316703206e6, -0.17073846940092e2, 0.1202082470247e5, -0.32325550322333e7, 0.1491510861353e2,
  -0.48232657361591e4, 0.40511340542057e6, -0.23855557567849, 0.65017534844798e3,
] as const;
const [n1, n2, n3, n4, n5, n6, n7, n8, n9, n10] = N4;

/** IF97 eq. 30: saturation pressure (MPa) at temperature T (K), 273.15 K ≤ T ≤ 647.096 K. */
export function saturationPressureMPa(temperatureK: number): number {
  if (!(temperatureK >= SATURATION_TEMPERATURE_MIN_K && temperatureK <= CRITICAL_TEMPERATURE_K)) {
    throw new CalculationInputError(null, `temperatureK must be between ${SATURATION_TEMPERATURE_MIN_K} and ${CRITICAL_TEMPERATURE_K}`);
  }
  const theta = temperatureK + n9 / (temperatureK - n10);
  const A = theta * theta + n1 * theta + n2;
  const B = n3 * theta * theta + n4 * theta + n5;
  const C = n6 * theta * theta + n7 * theta + n8;
  return Math.pow((2 * C) / (-B + Math.sqrt(B * B - 4 * A * C)), 4);
}

/** IF97 eq. 31: saturation temperature (K) at pressure p (MPa), 611.213 Pa ≤ p ≤ 22.064 MPa. */
export function saturationTemperatureK(pressureMPa: number): number {
  if (!(pressureMPa >= SATURATION_PRESSURE_MIN_MPA && pressureMPa <= CRITICAL_PRESSURE_MPA)) {
    throw new CalculationInputError(null, `pressureMPa must be between ${SATURATION_PRESSURE_MIN_MPA} and ${CRITICAL_PRESSURE_MPA}`);
  }
  const beta = Math.pow(pressureMPa, 0.25);
  const E = beta * beta + n3 * beta + n6;
  const F = n1 * beta * beta + n4 * beta + n7;
  const G = n2 * beta * beta + n5 * beta + n8;
  const D = (2 * G) / (-F - Math.sqrt(F * F - 4 * E * G));
  return (n10 + D - Math.sqrt((n10 + D) * (n10 + D) - 4 * (n9 + n10 * D))) / 2;
}

// Table 11: residual part of the region 2 Gibbs equation (Iᵢ, Jᵢ, nᵢ).
const REGION2_RESIDUAL: readonly (readonly [number, number, number])[] = [
  [1, 0, -0.17731742473213e-2],
  [1, 1, -0.17834862292358e-1],
  [1, 2, -0.45996013696365e-1],
  [1, 3, -0.57581259083432e-1],
  [1, 6, -0.5032527872793e-1],
  [2, 1, -0.33032641670203e-4],
  [2, 2, -0.18948987516315e-3],
  [2, 4, -0.39392777243355e-2],
  [2, 7, -0.43797295650573e-1],
  [2, 36, -0.26674547914087e-4],
  [3, 0, 0.20481737692309e-7],
  [3, 1, 0.43870667284435e-6],
  [3, 3, -0.3227767723857e-4],
  [3, 6, -0.15033924542148e-2],
  [3, 35, -0.40668253562649e-1],
  [4, 1, -0.78847309559367e-9],
  [4, 2, 0.12790717852285e-7],
  [4, 3, 0.48225372718507e-6],
  [5, 7, 0.22922076337661e-5],
  [6, 3, -0.16714766451061e-10],
  [6, 16, -0.21171472321355e-2],
  [6, 35, -0.23895741934104e2],
  [7, 0, -0.5905956432427e-17],
  [7, 11, -0.12621808899101e-5],
  [7, 25, -0.38946842435739e-1],
  [8, 8, 0.11256211360459e-10],
  [8, 36, -0.82311340897998e1],
  [9, 13, 0.19809712802088e-7],
  [10, 4, 0.10406965210174e-18],
  [10, 10, -0.10234747095929e-12],
  [10, 14, -0.10018179379511e-8],
  [16, 29, -0.80882908646985e-10],
  [16, 50, 0.10693031879409],
  [18, 57, -0.33662250574171],
  [20, 20, 0.89185845355421e-24],
  [20, 35, 0.30629316876232e-12],
  [20, 48, -0.42002467698208e-5],
  [21, 21, -0.59056029685639e-25],
  [22, 53, 0.37826947613457e-5],
  [23, 39, -0.12768608934681e-14],
  [24, 26, 0.73087610595061e-28],
  [24, 40, 0.55414715350778e-16],
  [24, 58, -0.9436970724121e-6],
];

/**
 * IF97 region 2 specific volume (m³/kg) at temperature T (K) and pressure p (MPa). The caller keeps
 * to region 2 (vapour side of the saturation line, T ≤ 1073.15 K); this function does not check the
 * region boundaries beyond requiring positive T and p.
 */
export function region2SpecificVolumeM3PerKg(temperatureK: number, pressureMPa: number): number {
  if (!(temperatureK > 0 && pressureMPa > 0)) throw new CalculationInputError(null, 'temperatureK and pressureMPa must be positive');
  const pi = pressureMPa; // p* = 1 MPa
  const tauShift = 540 / temperatureK - 0.5;
  let residualGammaPi = 0;
  for (const [I, J, n] of REGION2_RESIDUAL) {
    residualGammaPi += n * I * Math.pow(pi, I - 1) * Math.pow(tauShift, J);
  }
  // v = R·T/p · π·(1/π + γʳ_π); R·T in kJ/kg over p in kPa gives m³/kg.
  return ((R_KJ_PER_KG_K * temperatureK) / (pressureMPa * 1000)) * (1 + pi * residualGammaPi);
}

/** Specific volume of dry saturated vapour v_g (m³/kg) at pressure p (MPa), up to 16.529 MPa (623.15 K). */
export function saturatedVapourSpecificVolumeM3PerKg(pressureMPa: number): number {
  const temperatureK = saturationTemperatureK(pressureMPa);
  if (temperatureK > REGION2_SATURATION_TEMPERATURE_MAX_K) {
    throw new CalculationInputError(null, 'above 623.15 K the saturated vapour lies in IF97 region 3, which is not implemented');
  }
  return region2SpecificVolumeM3PerKg(temperatureK, pressureMPa);
}

/** Saturation temperature (°F) at an absolute pressure (psia). */
export function saturationTemperatureFFromPsia(pressurePsia: number): number {
  return celsiusToFahrenheit(saturationTemperatureK(pressurePsia * MPA_PER_PSI) - KELVIN_AT_0_C);
}

/** Saturation pressure (psia) at a temperature (°F). */
export function saturationPressurePsiaFromF(temperatureF: number): number {
  return saturationPressureMPa(fahrenheitToCelsius(temperatureF) + KELVIN_AT_0_C) / MPA_PER_PSI;
}

/** Specific volume of dry saturated steam v_g (ft³/lb) at an absolute pressure (psia). */
export function saturatedVapourSpecificVolumeFt3PerLb(pressurePsia: number): number {
  return saturatedVapourSpecificVolumeM3PerKg(pressurePsia * MPA_PER_PSI) * FT3_PER_LB_PER_M3_PER_KG;
}

// ---------------------------------------------------------------------------------------------
// Steam accounted for by the indicator diagram
// ---------------------------------------------------------------------------------------------

/**
 * Cylinder volume (ft³) when the piston has moved `strokeFraction` of its stroke from the end the card
 * belongs to, including that end's clearance: A/144 · L · (x + c).
 */
export function cylinderVolumeFt3(input: {
  effectiveAreaSqIn: number;
  strokeIn: number;
  strokeFraction: number;
  clearanceFraction: number;
}): number {
  return (input.effectiveAreaSqIn / 144) * (input.strokeIn / 12) * (input.strokeFraction + input.clearanceFraction);
}

export interface DiagramSteamResult {
  /** Weight of steam used per working stroke: present at the expansion point less that kept at the compression point, lb. */
  steamPerStrokeLb: number;
  steamPerHourLb: number;
  /** Steam accounted for by the diagram, lb per indicated horsepower-hour. */
  steamPerIhpHourLb: number;
}

/**
 * Textbook method, with the specific volumes given: the steam present at a point on the expansion line
 * (volume ÷ specific volume) less the steam kept at a point on the compression line is the weight
 * exhausted per stroke; × strokes per hour ÷ IHP gives lb per IHP-hour. This misses the steam condensed
 * in the cylinder, so it is less than the measured water rate.
 */
export function steamAccountedForFromSpecificVolumes(input: {
  expansionVolumeFt3: number;
  expansionSpecificVolumeFt3PerLb: number;
  compressionVolumeFt3: number;
  compressionSpecificVolumeFt3PerLb: number;
  speedRpm: number;
  /** Working strokes per revolution the figures stand for: 2 for both ends alike, 1 for one end. */
  strokesPerRevolution: number;
  indicatedHorsepower: number;
}): DiagramSteamResult {
  const positive: (keyof typeof input)[] = [
    'expansionVolumeFt3',
    'expansionSpecificVolumeFt3PerLb',
    'compressionSpecificVolumeFt3PerLb',
    'speedRpm',
    'strokesPerRevolution',
    'indicatedHorsepower',
  ];
  for (const key of positive) {
    if (!(Number.isFinite(input[key]) && input[key] > 0)) throw new CalculationInputError(null, `${key} must be greater than zero`);
  }
  if (!(Number.isFinite(input.compressionVolumeFt3) && input.compressionVolumeFt3 >= 0)) {
    throw new CalculationInputError(null, 'compressionVolumeFt3 must not be negative');
  }
  const presentLb = input.expansionVolumeFt3 / input.expansionSpecificVolumeFt3PerLb;
  const keptLb = input.compressionVolumeFt3 / input.compressionSpecificVolumeFt3PerLb;
  const steamPerStrokeLb = presentLb - keptLb;
  if (!(steamPerStrokeLb > 0)) {
    throw new CalculationInputError(
      null,
      `steam accounted for comes out negative: the steam kept at compression (${keptLb.toPrecision(3)} lb) is not less than ` +
        `the steam present on the expansion line (${presentLb.toPrecision(3)} lb); check the expansion and compression points ` +
        'and their pressures',
    );
  }
  const steamPerHourLb = steamPerStrokeLb * input.speedRpm * input.strokesPerRevolution * 60;
  return { steamPerStrokeLb, steamPerHourLb, steamPerIhpHourLb: steamPerHourLb / input.indicatedHorsepower };
}

export interface DiagramSteamInput {
  /** Cylinder volume incl. clearance at the chosen point on the expansion line (cut-off, or just before release), ft³. */
  expansionVolumeFt3: number;
  /** Absolute pressure at that point, read from the card, psia. */
  expansionPressurePsia: number;
  /** Cylinder volume incl. clearance at the chosen point on the compression line (after exhaust closure), ft³. */
  compressionVolumeFt3: number;
  /** Absolute pressure at that point, psia. */
  compressionPressurePsia: number;
  speedRpm: number;
  /** 2 (default) when the figures stand for both ends of the cylinder, 1 for one end. */
  strokesPerRevolution?: number;
  /** Indicated horsepower the steam is charged to (both ends, or the one end), hp. */
  indicatedHorsepower: number;
}

/** Steam accounted for by the diagram, with dry saturated specific volumes from IF97 at the card's pressures. */
export function steamAccountedForByDiagram(input: DiagramSteamInput): DiagramSteamResult & {
  expansionSpecificVolumeFt3PerLb: number;
  compressionSpecificVolumeFt3PerLb: number;
} {
  const expansionSpecificVolumeFt3PerLb = saturatedVapourSpecificVolumeFt3PerLb(input.expansionPressurePsia);
  const compressionSpecificVolumeFt3PerLb = saturatedVapourSpecificVolumeFt3PerLb(input.compressionPressurePsia);
  if (
    input.expansionVolumeFt3 / expansionSpecificVolumeFt3PerLb <= input.compressionVolumeFt3 / compressionSpecificVolumeFt3PerLb &&
    input.expansionPressurePsia < input.compressionPressurePsia
  ) {
    throw new CalculationInputError(
      null,
      `steam accounted for comes out negative: the expansion pressure (${input.expansionPressurePsia.toFixed(1)} psia) is below ` +
        `the compression pressure (${input.compressionPressurePsia.toFixed(1)} psia); check the cut-off, compression and pressure readings`,
    );
  }
  return {
    ...steamAccountedForFromSpecificVolumes({
      expansionVolumeFt3: input.expansionVolumeFt3,
      expansionSpecificVolumeFt3PerLb,
      compressionVolumeFt3: input.compressionVolumeFt3,
      compressionSpecificVolumeFt3PerLb,
      speedRpm: input.speedRpm,
      strokesPerRevolution: input.strokesPerRevolution ?? 2,
      indicatedHorsepower: input.indicatedHorsepower,
    }),
    expansionSpecificVolumeFt3PerLb,
    compressionSpecificVolumeFt3PerLb,
  };
}
