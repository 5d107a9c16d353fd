import { Body, Controller, HttpCode, Post } from '@nestjs/common';
import { ApiBadRequestResponse, ApiBody, ApiBearerAuth, ApiOperation, ApiTags } from '@nestjs/swagger';
import { AnyRole } from '../../common/decorators/roles.decorator.js';
import { computeIndicatedPower } from '../../calculations/indicated-power.js';
import { ApiAnswer } from '../../common/openapi/api-answer.decorator.js';
import {
  IndicatedPowerRequestDto,
  IndicatedPowerResponseDto,
  TraceCalibrationRequestDto,
  TraceCalibrationResponseDto,
} from './dto/calculations.dto.js';
import { calibrateCardTrace } from './card-set-results.js';

/** Stateless calculators for indicator cards (nothing is stored). */
@ApiTags('calculations')
@ApiBearerAuth()
@Controller('calculations')
export class IndicatorCalculationsController {
  @Post('indicated-power')
  @HttpCode(200)
  @AnyRole()
  @ApiOperation({
    summary: 'Indicated power of a set of cards',
    description:
      'Each card gives exactly one of: meanEffectivePressurePsi; areaSqIn with lengthIn and springPsiPerIn; ' +
      'ordinatesIn with springPsiPerIn. ' +
      'IHP per end = P·L·A·N/33,000 (head end less any tail rod, crank end less the piston rod, N = rpm); ' +
      "referredMeanEffectivePressurePsi refers every cylinder's work to the largest cylinder's area. " +
      'A card with two ways or none, a non-positive dimension, a rod not smaller than its bore or two cards for one end ' +
      'answers 400 naming the field.',
  })
  @ApiBody({
    type: IndicatedPowerRequestDto,
    examples: {
      compound: {
        summary: 'A tandem pair at 64 rpm: the high-pressure cylinder by mean effective pressure, the low by planimeter area',
        value: {
          rpm: 64,
          strokeIn: 48,
          cylinders: [
            {
              label: 'HP',
              boreIn: 20,
              pistonRodIn: 4,
              tailRodIn: 0,
              cards: [
                { end: 'head', meanEffectivePressurePsi: 38.5 },
                { end: 'crank', meanEffectivePressurePsi: 36.2 },
              ],
            },
            {
              label: 'LP',
              boreIn: 36,
              pistonRodIn: 4,
              tailRodIn: 4,
              cards: [
                { end: 'head', areaSqIn: 1.1, lengthIn: 3.6, springPsiPerIn: 30 },
                { end: 'crank', areaSqIn: 1.05, lengthIn: 3.6, springPsiPerIn: 30 },
              ],
            },
          ],
        },
      },
    },
  })
  @ApiAnswer('IndicatedPowerResponse')
  @ApiBadRequestResponse({ description: 'The body is not valid; the message names the field, e.g. "cylinders[0].cards[1].areaSqIn: …".' })
  indicatedPower(@Body() dto: IndicatedPowerRequestDto): IndicatedPowerResponseDto {
    return computeIndicatedPower(dto);
  }

  @Post('indicator-trace')
  @HttpCode(200)
  @AnyRole()
  @ApiOperation({
    summary: 'Calibrate a traced card image',
    description:
      'The atmospheric line and the two ends of the diagram set the frame; the card length (or a known pixels-per-inch) sets the scale. ' +
      'Answers the area from the traced polygon (shoelace), mean height, mean effective pressure and the outline in card coordinates.',
  })
  @ApiAnswer('TraceCalibrationResponse')
  @ApiBadRequestResponse({ description: 'The trace or scale is not valid; the message names the field.' })
  indicatorTrace(@Body() dto: TraceCalibrationRequestDto): TraceCalibrationResponseDto {
    return calibrateCardTrace(dto.trace, dto.springPsiPerIn, dto.lengthIn);
  }
}
