import { BadRequestException, Body, Controller, HttpCode, Post } from '@nestjs/common';
import { ApiBadRequestResponse, ApiBearerAuth, ApiOperation, ApiTags } from '@nestjs/swagger';
import { AnyRole } from '../../common/decorators/roles.decorator.js';
import { hpToKw } from '../../calculations/units.js';
import {
  JACKING_CAUTION,
  JACK_MARGIN_RULE_TEXT,
  LIFT_PRESSURE_RULE_TEXT,
  jackCapacityCheck,
  journalFriction,
  liftPressure,
  oilViscosity,
} from '../../calculations/lubrication.js';
import { ApiAnswer } from '../../common/openapi/api-answer.decorator.js';
import {
  JackCapacityRequestDto,
  JackCapacityResponseDto,
  JournalFrictionRequestDto,
  JournalFrictionResponseDto,
  LiftPressureRequestDto,
  LiftPressureResponseDto,
  OilViscosityRequestDto,
  OilViscosityResponseDto,
} from './dto/calculations.dto.js';

export const VISCOSITY_METHOD =
  'ASTM D341 (Walther): log10 log10(\u03bd + 0.7) = A \u2212 B\u00b7log10 T, T in kelvin, ' +
  'A and B fixed by the 40 \u00b0C and 100 \u00b0C figures; ' +
  'absolute viscosity \u03bc = \u03bd\u00b7\u03c1 with \u03c1(T) = \u03c115\u00b7(1 \u2212 0.00065\u00b7(T \u2212 15 \u00b0C)).';
export const FRICTION_METHOD =
  'Petroff (concentric journal): T = 4\u03c0\u00b2\u03bcNr\u00b3l/c, f = 2\u03c0\u00b2(\u03bcN/P)(r/c), ' +
  'power = 2\u03c0NT, S = (r/c)\u00b2\u03bcN/P with N in rev/s and P = W/(D\u00b7L). ' +
  'Petroff ignores the eccentricity of a loaded journal, so a slow, heavily loaded bearing (small S) ' +
  'really loses more than this: read it as the lower bound.';

/** Stateless lubrication calculators (nothing is stored): viscosity, journal friction, lift pressure, jacks. */
@ApiTags('calculations')
@ApiBearerAuth()
@Controller('calculations')
export class LubricationCalculationsController {
  @Post('oil-viscosity')
  @HttpCode(200)
  @AnyRole()
  @ApiOperation({ summary: 'Oil viscosity at a temperature from its 40 °C and 100 °C figures', description: VISCOSITY_METHOD })
  @ApiAnswer('OilViscosityResponse')
  @ApiBadRequestResponse({
    description: 'A field is missing or out of range, or the 100 °C figure is not below the 40 °C one; the message names the field.',
  })
  oilViscosity(@Body() dto: OilViscosityRequestDto): OilViscosityResponseDto {
    if (dto.viscosity100cSt >= dto.viscosity40cSt)
      throw new BadRequestException({
        statusCode: 400,
        error: 'Bad Request',
        message: ['viscosity100cSt must be lower than viscosity40cSt (oil thins as it warms)'],
      });
    return { ...oilViscosity(dto), method: VISCOSITY_METHOD };
  }

  @Post('journal-friction')
  @HttpCode(200)
  @AnyRole()
  @ApiOperation({ summary: 'Petroff friction, power lost and Sommerfeld number of a journal bearing', description: FRICTION_METHOD })
  @ApiAnswer('JournalFrictionResponse')
  @ApiBadRequestResponse({ description: 'A field is missing or out of range; the message names the field.' })
  journalFriction(@Body() dto: JournalFrictionRequestDto): JournalFrictionResponseDto {
    if (dto.radialClearanceIn * 2 >= dto.diameterIn)
      throw new BadRequestException({
        statusCode: 400,
        error: 'Bad Request',
        message: ['radialClearanceIn must be far smaller than the journal'],
      });
    const r = journalFriction(dto);
    return { ...r, powerLossKw: hpToKw(r.powerLossHp), method: FRICTION_METHOD };
  }

  @Post('lift-pressure')
  @HttpCode(200)
  @AnyRole()
  @ApiOperation({
    summary: 'Oil pressure to lift a journal (pre-lube / hydrostatic jacking)',
    description: LIFT_PRESSURE_RULE_TEXT + ' ' + JACKING_CAUTION,
  })
  @ApiAnswer('LiftPressureResponse')
  @ApiBadRequestResponse({ description: 'A field is missing or out of range; the message names the field.' })
  liftPressure(@Body() dto: LiftPressureRequestDto): LiftPressureResponseDto {
    return { ...liftPressure(dto), rule: LIFT_PRESSURE_RULE_TEXT, caution: JACKING_CAUTION };
  }

  @Post('jack-capacity')
  @HttpCode(200)
  @AnyRole()
  @ApiOperation({ summary: 'Are the jacks rated with margin for the load?', description: JACK_MARGIN_RULE_TEXT + ' ' + JACKING_CAUTION })
  @ApiAnswer('JackCapacityResponse')
  @ApiBadRequestResponse({ description: 'A field is missing or out of range; the message names the field.' })
  jackCapacity(@Body() dto: JackCapacityRequestDto): JackCapacityResponseDto {
    return { ...jackCapacityCheck(dto), rule: JACK_MARGIN_RULE_TEXT, caution: JACKING_CAUTION };
  }
}
