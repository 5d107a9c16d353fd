import { applyDecorators } from '@nestjs/common';
import { IsNumber, Max, ValidateBy, type ValidationOptions } from 'class-validator';

/** A finite number above zero and at most `max`, with messages naming the field. */
export function IsPositiveNumberUpTo(max: number, validationOptions?: ValidationOptions) {
  return applyDecorators(
    IsNumber(
      { allowNaN: false, allowInfinity: false },
      { message: ({ property }) => `${property} must be a number`, ...validationOptions },
    ),
    ValidateBy(
      {
        name: 'isAboveZero',
        validator: {
          validate: (v: unknown) => typeof v !== 'number' || v > 0,
          defaultMessage: (a) => `${a?.property} must be greater than zero`,
        },
      },
      validationOptions,
    ),
    Max(max, { message: ({ property }) => `${property} must be at most ${max}`, ...validationOptions }),
  );
}
