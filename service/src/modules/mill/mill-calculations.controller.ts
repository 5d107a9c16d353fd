import { BadRequestException, Body, Controller, HttpCode, Post } from '@nestjs/common';
import { ApiBearerAuth, ApiOperation, ApiTags } from '@nestjs/swagger';
import type { RollingPassResponse } from '@crankjournal/shared-types';
import { AnyRole } from '../../common/decorators/roles.decorator.js';
import { MILL_LOAD_CAUTION } from '../../calculations/mill-pass.js';
import { ApiAnswer } from '../../common/openapi/api-answer.decorator.js';
import { RollingPassDto } from './dto/rolling-pass.dto.js';
import { calculatePass } from './pass-calculation.js';
import { DEFAULT_MILL_SETTINGS } from './mill.service.js';

/** Stateless calculators of the mill. */
@ApiTags('calculations')
@ApiBearerAuth()
@Controller('calculations')
export class MillCalculationsController {
  @Post('rolling-pass')
  @HttpCode(200)
  @AnyRole()
  @ApiOperation({
    summary:
      'One rolling pass: reduction, elongation, contact length, mean flow stress, roll force, torque, power, and the flywheel’s share',
    description:
      'Mean flow stress of hot plain carbon steel from Misaka & Yoshimoto (1967) unless meanFlowStressMPa is given; ' +
      'flagged as extrapolated ' +
      'outside 750–1200 °C or strain rates 30–200 /s (a slow mill runs below that range). Roll force F = L·w·Y·frictionFactor ' +
      'with L = √(R·Δh); ' +
      'torque per roll F·L/2; power for the roll pair 2π·F·L·N/60. ' +
      'Give all of the flywheel fields (flywheelMassLb, flywheelRadiusOfGyrationFt, ' +
      'engineSpeedRpm, ratedSpeedRpm, barExitLengthM, indicatedHp) for the speed drop and recovery time, or none. Warnings: stand_force, ' +
      'speed_drop, stall, no_surplus_power. Units are in every field name: Mm, C, Pct, Rpm, Kn, Lb, Ft, M, Hp, MPa.',
  })
  @ApiAnswer('RollingPassResponse', {
    description:
      'PassCalculationDto and a caution; forces in kN and lbf, torque in kN·m and lbf·ft, power in kW and hp, energies in kJ, times in s.',
  })
  rollingPass(@Body() dto: RollingPassDto): RollingPassResponse {
    const d = DEFAULT_MILL_SETTINGS;
    const missing = RollingPassDto.missingFlywheelFields(dto);
    if (missing.length)
      throw new BadRequestException(`The flywheel check needs every one of its fields, or none; missing: ${missing.join(', ')}.`);
    const flywheel =
      dto.flywheelMassLb !== undefined
        ? {
            flywheelMassLb: dto.flywheelMassLb,
            flywheelRadiusOfGyrationFt: dto.flywheelRadiusOfGyrationFt!,
            engineSpeedRpm: dto.engineSpeedRpm!,
            startSpeedSource: 'given',
            ratedSpeedRpm: dto.ratedSpeedRpm!,
            minSpeedFraction: dto.minSpeedFraction ?? d.minSpeedFraction,
            barExitLengthM: dto.barExitLengthM!,
            indicatedHp: dto.indicatedHp!,
            indicatedHpSource: 'given',
            mechanicalEfficiency: dto.mechanicalEfficiency ?? d.mechanicalEfficiency,
            baseLoadHp: dto.baseLoadHp ?? 0,
            creditEngineDuringPass: dto.creditEngineDuringPass ?? false,
          }
        : null;
    const calc = calculatePass({
      rollDiameterMm: dto.rollDiameterMm,
      entry: { shape: dto.entryShape ?? 'rectangle', heightMm: dto.entryThicknessMm, widthMm: dto.entryWidthMm },
      exit: { shape: dto.exitShape ?? 'rectangle', heightMm: dto.exitThicknessMm, widthMm: dto.exitWidthMm ?? dto.entryWidthMm },
      temperatureC: dto.temperatureC,
      carbonPct: dto.carbonPct,
      rollSpeedRpm: dto.rollSpeedRpm,
      standMaxForceKn: dto.standMaxForceKn,
      frictionFactor: dto.frictionFactor,
      meanFlowStressMPa: dto.meanFlowStressMPa,
      frictionCoefficient: dto.frictionCoefficient,
      forceModel: dto.forceModel,
      flywheel,
    });
    return { ...calc, caution: MILL_LOAD_CAUTION };
  }
}
