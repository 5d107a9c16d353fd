import { CalculationInputError } from './errors.js';

/**
 * Money for payments is held in integer minor units (pence, cents): the payment service's own unit.
 *
 *   minor units = round(amount × 10^digits), digits = the currency's minor-unit digits (ISO 4217: GBP 2, JPY 0)
 *   share of a total = round(total minor × percent / 100), half away from zero
 */

/** The currency's minor-unit digits as Intl knows them (ISO 4217). */
export function minorDigits(currency: string): number {
  try {
    return new Intl.NumberFormat('en', { style: 'currency', currency }).resolvedOptions().maximumFractionDigits ?? 2;
  } catch {
    throw new CalculationInputError('currency', `${currency} is not an ISO 4217 currency code.`);
  }
}

/** A decimal amount (as quotes hold it) in minor units of its currency. */
export function amountToMinorUnits(amount: number, currency: string): number {
  if (!Number.isFinite(amount)) throw new CalculationInputError('amount', 'must be a finite number');
  return Math.round(amount * 10 ** minorDigits(currency));
}

/** Minor units back to a decimal amount, for display through Intl.NumberFormat. */
export function minorUnitsToAmount(minor: number, currency: string): number {
  return minor / 10 ** minorDigits(currency);
}

/** A percentage share of a sum in minor units, rounded to a whole minor unit. */
export function shareOfMinorUnits(totalMinor: number, percent: number): number {
  if (!Number.isInteger(totalMinor) || totalMinor < 0)
    throw new CalculationInputError('totalMinor', 'must be whole minor units, 0 or more');
  if (!(percent >= 0 && percent <= 100)) throw new CalculationInputError('percent', 'must be between 0 and 100');
  return Math.round((totalMinor * percent) / 100);
}
