/**
 * Bad input to a calculation: a value the formula cannot take. It is a RangeError, so callers and tests that
 * expect one still hold; the HTTP edge answers it as a 400 (common/filters/calculation-input.filter.ts).
 *
 * With a field path the message reads `path: what is wrong` (e.g. `cylinders[0].cards[1].areaSqIn: must not be
 * negative`); without one the message is the whole sentence. `advice`, when given, is what a person is shown
 * instead of the technical message.
 */
export class CalculationInputError extends RangeError {
  constructor(
    public readonly fieldPath: string | null,
    message: string,
    public readonly advice?: string,
  ) {
    super(fieldPath ? `${fieldPath}: ${message}` : message);
    this.name = 'CalculationInputError';
  }
}
