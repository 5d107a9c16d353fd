import { ApiProperty, ApiPropertyOptional } from '@nestjs/swagger';
import { IsBoolean, IsIn, IsOptional } from 'class-validator';
import { SECTION_SHAPES, type RollingPassRequest, type SectionShape } from '@crankjournal/shared-types';
import { IsFiniteNumberIn } from '../../../common/dto/validators.js';
import { oneOf } from './section.dto.js';

/** The fields the flywheel check needs: give all of them, or none (RollingPassDto.missingFlywheelFields). */
export const FLYWHEEL_FIELDS = [
  'flywheelMassLb',
  'flywheelRadiusOfGyrationFt',
  'engineSpeedRpm',
  'ratedSpeedRpm',
  'barExitLengthM',
  'indicatedHp',
] as const;
const FLYWHEEL_OPTIONS = ['minSpeedFraction', 'mechanicalEfficiency', 'baseLoadHp', 'creditEngineDuringPass'] as const;

/** One rolling pass for the stateless calculator: a flat body with the unit in every name. */
export class RollingPassDto implements RollingPassRequest {
  @ApiProperty({ description: 'roll diameter, mm', example: 406.4 }) @IsFiniteNumberIn(50, 2000) rollDiameterMm: number;
  @ApiProperty({ description: 'entry height (thickness), mm', example: 76.2 }) @IsFiniteNumberIn(0.1, 1000) entryThicknessMm: number;
  @ApiProperty({ description: 'exit height (thickness), mm; less than the entry', example: 60 })
  @IsFiniteNumberIn(0.1, 1000)
  exitThicknessMm: number;
  @ApiProperty({ description: 'entry width, mm', example: 76.2 }) @IsFiniteNumberIn(0.1, 3000) entryWidthMm: number;
  @ApiPropertyOptional({ description: 'exit width after spread, mm (defaults to the entry width)', example: 82 })
  @IsOptional()
  @IsFiniteNumberIn(0.1, 3000)
  exitWidthMm?: number;
  @ApiPropertyOptional({ enum: SECTION_SHAPES, description: 'for the area and elongation; default rectangle' })
  @IsOptional()
  @IsIn(SECTION_SHAPES, oneOf(SECTION_SHAPES))
  entryShape?: SectionShape;
  @ApiPropertyOptional({ enum: SECTION_SHAPES, description: 'for the area and elongation; default rectangle' })
  @IsOptional()
  @IsIn(SECTION_SHAPES, oneOf(SECTION_SHAPES))
  exitShape?: SectionShape;
  @ApiProperty({ description: 'stock temperature in the pass, °C', example: 1100 }) @IsFiniteNumberIn(-50, 1500) temperatureC: number;
  @ApiProperty({ description: 'carbon content, weight %', example: 0.2 }) @IsFiniteNumberIn(0, 2.1) carbonPct: number;
  @ApiProperty({ description: 'roll speed, rpm', example: 75 }) @IsFiniteNumberIn(0.1, 2000) rollSpeedRpm: number;
  @ApiProperty({ description: "the stand's maximum separating force, kN", example: 1200 })
  @IsFiniteNumberIn(1, 100000)
  standMaxForceKn: number;
  @ApiPropertyOptional({ description: '1 = frictionless estimate; 1.2 allows about 20 % for friction (default 1.2)' })
  @IsOptional()
  @IsFiniteNumberIn(1, 2)
  frictionFactor?: number;
  @ApiPropertyOptional({
    description:
      'roll–stock friction coefficient for the bite check (Δh ≤ μ²·R) and the plane-strain geometry factor; default 0.3 (hot rolling)',
  })
  @IsOptional()
  @IsFiniteNumberIn(0.01, 1)
  frictionCoefficient?: number;
  @ApiPropertyOptional({
    enum: ['simple', 'plane_strain'],
    description: "'simple' (default): L·w·σ̄·frictionFactor; 'plane_strain': L·w·(2/√3)·σ̄·Q with the roll-gap geometry factor Q",
  })
  @IsOptional()
  @IsIn(['simple', 'plane_strain'], { message: "forceModel must be 'simple' or 'plane_strain'" })
  forceModel?: 'simple' | 'plane_strain';
  @ApiPropertyOptional({ description: 'mean flow stress, MPa, to use instead of the hot-steel equation' })
  @IsOptional()
  @IsFiniteNumberIn(0.1, 5000)
  meanFlowStressMPa?: number;

  @ApiPropertyOptional({ description: 'flywheel mass, lb', example: 156800 })
  @IsOptional()
  @IsFiniteNumberIn(1, 1e8)
  flywheelMassLb?: number;
  @ApiPropertyOptional({ description: 'flywheel radius of gyration, ft', example: 9.9 })
  @IsOptional()
  @IsFiniteNumberIn(0.01, 100)
  flywheelRadiusOfGyrationFt?: number;
  @ApiPropertyOptional({ description: 'engine (flywheel) speed as the bar enters, rpm', example: 75 })
  @IsOptional()
  @IsFiniteNumberIn(0.1, 2000)
  engineSpeedRpm?: number;
  @ApiPropertyOptional({ description: "the engine's rated speed, rpm", example: 75 })
  @IsOptional()
  @IsFiniteNumberIn(0.1, 2000)
  ratedSpeedRpm?: number;
  @ApiPropertyOptional({ description: 'length of the bar leaving the rolls, m', example: 1.8 })
  @IsOptional()
  @IsFiniteNumberIn(0.01, 500)
  barExitLengthM?: number;
  @ApiPropertyOptional({ description: "the engine's recent indicated horsepower, hp", example: 650 })
  @IsOptional()
  @IsFiniteNumberIn(0, 100000)
  indicatedHp?: number;
  @ApiPropertyOptional({ description: 'warn below this fraction of rated speed (default 0.9)' })
  @IsOptional()
  @IsFiniteNumberIn(0.5, 1)
  minSpeedFraction?: number;
  @ApiPropertyOptional({ description: 'mechanical efficiency, fraction (default 0.88)' })
  @IsOptional()
  @IsFiniteNumberIn(0.3, 1)
  mechanicalEfficiency?: number;
  @ApiPropertyOptional({ description: 'load besides the pass, hp (default 0)' })
  @IsOptional()
  @IsFiniteNumberIn(0, 100000)
  baseLoadHp?: number;
  @ApiPropertyOptional({ description: "credit the engine's surplus during the pass (default false: the flywheel gives the whole pass)" })
  @IsOptional()
  @IsBoolean({ message: 'creditEngineDuringPass must be true or false' })
  creditEngineDuringPass?: boolean;

  /** The flywheel fields left out when some were given (empty when all or none were). */
  static missingFlywheelFields(o: RollingPassDto): string[] {
    const given = (k: keyof RollingPassDto) => o[k] !== undefined && o[k] !== null;
    const any = FLYWHEEL_FIELDS.some(given) || FLYWHEEL_OPTIONS.some(given);
    return any ? FLYWHEEL_FIELDS.filter((k) => !given(k)) : [];
  }
}
