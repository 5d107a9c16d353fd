import { Controller, Get } from '@nestjs/common';
import { ApiBearerAuth, ApiTags } from '@nestjs/swagger';
import type { UnitConversionTable } from '@crankjournal/shared-types';
import { AnyRole } from '../../common/decorators/roles.decorator.js';
import { unitConversionTable } from '../../calculations/units.js';
import { ApiAnswer } from '../../common/openapi/api-answer.decorator.js';

@ApiTags('units')
@ApiBearerAuth()
@Controller('units')
export class UnitsController {
  /** How to show each stored unit to an imperial or a metric user (factors from mathjs). */
  @ApiAnswer('UnitConversionTable')
  @Get('conversions')
  @AnyRole()
  conversions(): UnitConversionTable {
    return unitConversionTable();
  }
}
