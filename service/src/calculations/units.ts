/**
 * Units, in one place for every module: the exact factors our formulas use directly, how a point's unit string is
 * read (which pressure scale, which temperature scale, speed), the engine's MAWP in a point's unit, and the display
 * conversions (factors from mathjs) the units route serves.
 */
import { create, all } from 'mathjs';
import { UNIT_LABELS, type UnitConversionTable } from '@crankjournal/shared-types';

/** 1 hp = 33,000 ft·lbf/min (mechanical horsepower). */
export const FT_LBF_PER_MIN_PER_HP = 33_000;
/** 1 mechanical hp in watts (exact by definition of the foot, pound and g_n). */
export const WATTS_PER_HP = 745.69987158227;
/** 1 psi in kilopascals. */
export const KPA_PER_PSI = 6.894757293168361;
/** Standard atmosphere in kilopascals. */
export const STANDARD_ATMOSPHERE_KPA = 101.325;
/** 1 bar in kilopascals (exact by definition). */
export const KPA_PER_BAR = 100;
export const STANDARD_ATMOSPHERE_PSI = STANDARD_ATMOSPHERE_KPA / KPA_PER_PSI;
/** 1 lb (avoirdupois pound mass) in kilograms (exact by definition). */
export const KG_PER_LB = 0.45359237;

export function psigToPsia(gaugePsi: number, atmosphericPsi = STANDARD_ATMOSPHERE_PSI): number {
  return gaugePsi + atmosphericPsi;
}
export function psiaToPsig(absolutePsi: number, atmosphericPsi = STANDARD_ATMOSPHERE_PSI): number {
  return absolutePsi - atmosphericPsi;
}
export function hpToKw(hp: number): number {
  return (hp * WATTS_PER_HP) / 1000;
}
export function fahrenheitToCelsius(f: number): number {
  return ((f - 32) * 5) / 9;
}
export function celsiusToFahrenheit(c: number): number {
  return (c * 9) / 5 + 32;
}

// ---------------------------------------------------------------------------------------------
// Reading a point's unit string
// ---------------------------------------------------------------------------------------------

export type PressureScale = 'psig' | 'psia' | 'kPa_gauge' | 'kPa_abs' | 'bar_gauge' | 'inHg_vacuum';
export type TemperatureScale = 'F' | 'C';

function normaliseUnit(unit: string): string {
  return unit.toLowerCase().replace(/[\s().]/g, '');
}

/**
 * Which pressure scale a unit string names, or null when it is not a pressure unit we know. Bare psi, kPa and bar
 * are gauge readings (what a dial on the engine shows); absolute pressures say so.
 */
export function pressureScaleOf(unit: string): PressureScale | null {
  switch (normaliseUnit(unit)) {
    case 'psig':
    case 'psi':
    case 'lb/in2':
      return 'psig';
    case 'psia':
      return 'psia';
    case 'kpa':
    case 'kpag':
    case 'kpagauge':
      return 'kPa_gauge';
    case 'kpaa':
    case 'kpaabs':
    case 'kpaabsolute':
      return 'kPa_abs';
    case 'bar':
    case 'barg':
    case 'bargauge':
      return 'bar_gauge';
    case 'inhg':
    case 'inhgvac':
    case 'inhgvacuum':
      return 'inHg_vacuum';
    default:
      return null;
  }
}

/** 'F' or 'C' for a temperature unit string, else null. */
export function temperatureScaleOf(unit: string): TemperatureScale | null {
  switch (normaliseUnit(unit)) {
    case '°f':
    case 'degf':
    case 'f':
    case 'ºf':
      return 'F';
    case '°c':
    case 'degc':
    case 'c':
    case 'ºc':
      return 'C';
    default:
      return null;
  }
}

/** True for a rotational speed unit (rev/min). */
export function isRpm(unit: string): boolean {
  const u = normaliseUnit(unit);
  return u === 'rpm' || u === 'r/min' || u === 'rev/min';
}

/** A gauge pressure in psig expressed on a pressure scale; null for the vacuum scale (not comparable). */
export function psigOnScale(psig: number, scale: PressureScale): number | null {
  switch (scale) {
    case 'psig':
      return psig;
    case 'psia':
      return psigToPsia(psig);
    case 'kPa_gauge':
      return psig * KPA_PER_PSI;
    case 'kPa_abs':
      return psigToPsia(psig) * KPA_PER_PSI;
    case 'bar_gauge':
      return (psig * KPA_PER_PSI) / KPA_PER_BAR;
    case 'inHg_vacuum':
      return null;
  }
}

/** A reading on a pressure scale as gauge psi (the inverse of psigOnScale); null for the vacuum scale. */
export function psigFromScale(value: number, scale: PressureScale): number | null {
  switch (scale) {
    case 'psig':
      return value;
    case 'psia':
      return psiaToPsig(value);
    case 'kPa_gauge':
      return value / KPA_PER_PSI;
    case 'kPa_abs':
      return psiaToPsig(value / KPA_PER_PSI);
    case 'bar_gauge':
      return (value * KPA_PER_BAR) / KPA_PER_PSI;
    case 'inHg_vacuum':
      return null;
  }
}

/**
 * The engine's MAWP (psig) expressed in a pressure point's own unit, or null when that unit cannot
 * be compared with a gauge steam pressure.
 */
export function mawpInPointUnit(mawpPsig: number, unit: string): number | null {
  const scale = pressureScaleOf(unit);
  return scale === null ? null : psigOnScale(mawpPsig, scale);
}

/** The absolute pressure in kPa of a reading on a gauge or absolute scale; null for vacuum or an unknown unit. */
export function absoluteKpaOf(value: number, scale: PressureScale): number | null {
  switch (scale) {
    case 'psig':
      return psigToPsia(value) * KPA_PER_PSI;
    case 'psia':
      return value * KPA_PER_PSI;
    case 'kPa_gauge':
      return value + STANDARD_ATMOSPHERE_KPA;
    case 'kPa_abs':
      return value;
    case 'bar_gauge':
      return value * KPA_PER_BAR + STANDARD_ATMOSPHERE_KPA;
    case 'inHg_vacuum':
      return null;
  }
}

/** A temperature in one unit expressed in another (°F or °C), or null when either is no temperature unit. */
export function temperatureInUnit(value: number, fromUnit: string, toUnit: string): number | null {
  if (fromUnit === toUnit) return value;
  const from = temperatureScaleOf(fromUnit);
  const to = temperatureScaleOf(toUnit);
  if (from === null || to === null) return null;
  if (from === to) return value;
  return from === 'C' ? celsiusToFahrenheit(value) : fahrenheitToCelsius(value);
}

/** How a stored unit is written for people (°F for degF), or the unit itself when it has no label. */
export function unitLabel(unit: string): string {
  return UNIT_LABELS[unit] ?? unit;
}

// ---------------------------------------------------------------------------------------------
// Display conversions (imperial and metric users), factors from mathjs
// ---------------------------------------------------------------------------------------------

const math = create(all);
// mathjs knows mmHg but not the inch of mercury; 1 inHg = 25.4 mmHg (conventional, 0 °C).
math.createUnit('inHg', '25.4 mmHg');

/** Stored unit → [mathjs unit, imperial display, metric display]. Gauge and vacuum scales keep their zero. */
const DISPLAY: Record<string, { mathjs: string; imperial: [string, string]; metric: [string, string] }> = {
  psig: { mathjs: 'psi', imperial: ['psig', 'psi'], metric: ['bar', 'bar'] },
  psia: { mathjs: 'psi', imperial: ['psia', 'psi'], metric: ['kPa', 'kPa'] },
  psi: { mathjs: 'psi', imperial: ['psi', 'psi'], metric: ['bar', 'bar'] },
  kPa: { mathjs: 'kPa', imperial: ['psi', 'psi'], metric: ['kPa', 'kPa'] },
  bar: { mathjs: 'bar', imperial: ['psig', 'psi'], metric: ['bar', 'bar'] },
  inHg: { mathjs: 'inHg', imperial: ['inHg', 'inHg'], metric: ['kPa', 'kPa'] },
  degF: { mathjs: 'degF', imperial: ['degF', 'degF'], metric: ['degC', 'degC'] },
  degC: { mathjs: 'degC', imperial: ['degF', 'degF'], metric: ['degC', 'degC'] },
  in: { mathjs: 'inch', imperial: ['in', 'inch'], metric: ['mm', 'mm'] },
  mm: { mathjs: 'mm', imperial: ['in', 'inch'], metric: ['mm', 'mm'] },
  'pint/h': { mathjs: 'pint', imperial: ['pint/h', 'pint'], metric: ['mL/h', 'mL'] },
  'mL/h': { mathjs: 'mL', imperial: ['pint/h', 'pint'], metric: ['mL/h', 'mL'] },
};

let table: UnitConversionTable | null = null;

/** display = stored × factor + offset, computed once from mathjs for every unit we store. */
export function unitConversionTable(): UnitConversionTable {
  if (table) return table;
  const out: UnitConversionTable = { imperial: {}, metric: {} };
  for (const [stored, d] of Object.entries(DISPLAY)) {
    for (const system of ['imperial', 'metric'] as const) {
      const [label, target] = d[system];
      const at = (x: number) => math.unit(x, d.mathjs).toNumber(target);
      const offset = at(0);
      const factor = at(1) - offset;
      out[system][stored] = { from: stored, to: label, factor, offset: Math.abs(offset) < 1e-12 ? 0 : offset };
    }
  }
  return (table = out);
}
