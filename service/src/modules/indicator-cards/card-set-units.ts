import { KPA_PER_PSI, psiaToPsig } from '../../calculations/units.js';
import { KPA_PER_INCH_OF_MERCURY } from '../../calculations/vacuum.js';

/** A reading's value on the psi gauge basis (pressure points may be logged in other units). */
export function asPsig(value: number, unit: string): number | null {
  switch (unit) {
    case 'psig':
    case 'psi':
      return value;
    case 'psia':
      return psiaToPsig(value);
    case 'kPa':
      return value / KPA_PER_PSI;
    case 'bar':
      return (value * 100) / KPA_PER_PSI;
    default:
      return null;
  }
}

/** A barometer reading in inches of mercury absolute (barometer points may be logged in kPa, psia or bar). */
export function asBarometerInHg(value: number, unit: string): number | null {
  switch (unit) {
    case 'inHg':
      return value;
    case 'kPa':
      return value / KPA_PER_INCH_OF_MERCURY;
    case 'psia':
      return (value * KPA_PER_PSI) / KPA_PER_INCH_OF_MERCURY;
    case 'bar':
      return (value * 100) / KPA_PER_INCH_OF_MERCURY;
    default:
      return null;
  }
}

/** A reading's value in inches of mercury of vacuum (vacuum points may be logged in kPa). */
export function asInHg(value: number, unit: string): number | null {
  if (unit === 'inHg') return value;
  if (unit === 'kPa') return value / KPA_PER_INCH_OF_MERCURY;
  return null;
}
