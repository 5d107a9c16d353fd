/**
 * Unit constants and conversions owned by the project. mathjs handles general unit conversion
 * (see units.convert.ts); these are the few exact factors our formulas use directly.
 */
/** 1 hp = 33,000 ft·lbf/min (mechanical horsepower). */
export const FT_LBF_PER_MIN_PER_HP = 33_000;
/** 1 mechanical hp in watts (exact by definition of the foot, pound and g_n). */
export const WATTS_PER_HP = 745.69987158227;
/** 1 psi in kilopascals. */
export const KPA_PER_PSI = 6.894757293168361;
/** Standard atmosphere in kilopascals. */
export const STANDARD_ATMOSPHERE_KPA = 101.325;
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
