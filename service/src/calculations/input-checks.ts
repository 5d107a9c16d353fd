/** Input checks shared by the calculation modules; each throws a CalculationInputError (a RangeError) naming the field. */
import { CalculationInputError } from './errors.js';
export function assertFinite(name: string, value: number): void {
  if (typeof value !== 'number' || !Number.isFinite(value)) throw new CalculationInputError(null, `${name} must be a finite number`);
}
export function assertPositive(name: string, value: number): void {
  assertFinite(name, value);
  if (value <= 0) throw new CalculationInputError(null, `${name} must be greater than zero`);
}
export function assertNonNegative(name: string, value: number): void {
  assertFinite(name, value);
  if (value < 0) throw new CalculationInputError(null, `${name} must be zero or greater`);
}
