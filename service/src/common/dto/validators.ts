import { applyDecorators } from '@nestjs/common';
import { IsNumber, Max, Min } from 'class-validator';

/** A finite number within [min, max] (NaN, Infinity and strings refused), with a readable message. */
export function IsFiniteNumberIn(min: number, max: number) {
  return applyDecorators(
    IsNumber({ allowNaN: false, allowInfinity: false }, { message: ({ property }) => `${property} must be a number` }),
    Min(min, { message: ({ property }) => `${property} must be at least ${min}` }),
    Max(max, { message: ({ property }) => `${property} must be at most ${max}` }),
  );
}
