import { ArgumentsHost, Catch, type ExceptionFilter, HttpStatus } from '@nestjs/common';
import type { Response } from 'express';
import type { ApiError } from '@crankjournal/shared-types';
import { CalculationInputError } from '../../calculations/errors.js';

/**
 * A calculation refused its input (a value its formula cannot take): 400 in the one error shape, with the field
 * and what is wrong, or the advice the calculation gave for a person. Routes and services let it pass through.
 */
@Catch(CalculationInputError)
export class CalculationInputFilter implements ExceptionFilter<CalculationInputError> {
  catch(exception: CalculationInputError, host: ArgumentsHost): void {
    if (host.getType() !== 'http') return;
    const body: ApiError = {
      statusCode: HttpStatus.BAD_REQUEST,
      error: 'Bad Request',
      message: [exception.advice ?? exception.message],
    };
    host.switchToHttp().getResponse<Response>().status(body.statusCode).json(body);
  }
}
