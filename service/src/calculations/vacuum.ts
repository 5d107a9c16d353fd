/**
 * Vacuum gauges in inches of mercury, and the absolute pressure they stand for.
 *
 * A vacuum gauge reads how far below the atmosphere a space is; the absolute pressure is the
 * atmosphere less that depression. The inch of mercury here is the conventional one (mercury of
 * density 13.5951 g/cm³ under standard gravity), 3.386389 kPa (NIST SP 811, 2008, appendix B.8).
 *
 * Pure functions; psi and inches of mercury as named.
 */
import { KPA_PER_PSI, STANDARD_ATMOSPHERE_PSI } from './units.js';
import { CalculationInputError } from './errors.js';

/** 1 inHg (conventional) in kilopascals (NIST SP 811, 2008, appendix B.8). */
export const KPA_PER_INCH_OF_MERCURY = 3.386389;
/** 1 inHg (conventional) in psi. */
export const PSI_PER_INCH_OF_MERCURY = KPA_PER_INCH_OF_MERCURY / KPA_PER_PSI;

/**
 * Absolute pressure (psia) of a space whose vacuum gauge reads `vacuumInHg`, under an atmosphere of
 * `atmosphericPsia` (standard atmosphere by default). Throws RangeError for a negative or non-finite
 * reading, or one deeper than the atmosphere itself.
 */
export function vacuumInHgToPsia(vacuumInHg: number, atmosphericPsia = STANDARD_ATMOSPHERE_PSI): number {
  if (!Number.isFinite(vacuumInHg) || vacuumInHg < 0) throw new CalculationInputError(null, 'vacuumInHg must be a number of at least 0');
  if (!(Number.isFinite(atmosphericPsia) && atmosphericPsia > 0))
    throw new CalculationInputError(null, 'atmosphericPsia must be greater than zero');
  const absolutePsia = atmosphericPsia - vacuumInHg * PSI_PER_INCH_OF_MERCURY;
  if (absolutePsia <= 0) throw new CalculationInputError(null, 'vacuumInHg is deeper than the atmosphere allows');
  return absolutePsia;
}
