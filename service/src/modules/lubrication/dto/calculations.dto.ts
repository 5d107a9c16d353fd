import { ApiProperty, ApiPropertyOptional } from '@nestjs/swagger';
import { IsInt, IsOptional, Max, Min } from 'class-validator';
import type {
  JackCapacityRequest,
  JackCapacityResponse,
  JournalFrictionRequest,
  JournalFrictionResponse,
  LiftPressureRequest,
  LiftPressureResponse,
  OilViscosityRequest,
  OilViscosityResponse,
} from '@crankjournal/shared-types';
import { IsFiniteNumberIn } from '../../../common/dto/validators.js';

export class OilViscosityRequestDto implements OilViscosityRequest {
  @ApiProperty({ description: 'Kinematic viscosity at 40 °C from the data sheet, cSt (mm²/s)', example: 150 })
  @IsFiniteNumberIn(0.5, 100_000)
  viscosity40cSt: number;
  @ApiProperty({ description: 'Kinematic viscosity at 100 °C from the data sheet, cSt; must be lower than at 40 °C', example: 14.5 })
  @IsFiniteNumberIn(0.5, 10_000)
  viscosity100cSt: number;
  @ApiProperty({ description: 'Temperature at which the viscosity is wanted, °C', example: 45 })
  @IsFiniteNumberIn(-40, 250)
  temperatureC: number;
  @ApiPropertyOptional({ description: 'Density at 15 °C, kg/m³; 880 kg/m³ is assumed when omitted', example: 890 })
  @IsOptional()
  @IsFiniteNumberIn(500, 1500)
  densityKgM3At15C?: number;
}
export class OilViscosityResponseDto implements OilViscosityResponse {
  @ApiProperty({ description: 'cSt (mm²/s)' }) kinematicCst: number;
  @ApiProperty({ description: 'kg/m³ at the temperature asked' }) densityKgM3: number;
  @ApiProperty({ description: 'true when no density was given and 880 kg/m³ at 15 °C was assumed' }) densityAssumed: boolean;
  @ApiProperty({ description: 'absolute viscosity, Pa·s' }) dynamicPaS: number;
  @ApiProperty({ description: 'absolute viscosity, reyn (lbf·s/in²)' }) dynamicReyn: number;
  @ApiProperty() method: string;
}

export class JournalFrictionRequestDto implements JournalFrictionRequest {
  @ApiProperty({ description: 'Journal diameter, in', example: 16 }) @IsFiniteNumberIn(0.05, 200) diameterIn: number;
  @ApiProperty({ description: 'Bearing length, in', example: 26 }) @IsFiniteNumberIn(0.05, 400) lengthIn: number;
  @ApiProperty({ description: 'Radial clearance (half the diametral clearance), in', example: 0.008 })
  @IsFiniteNumberIn(0.00001, 1)
  radialClearanceIn: number;
  @ApiProperty({ description: 'Journal speed, rpm', example: 75 }) @IsFiniteNumberIn(0, 100_000) speedRpm: number;
  @ApiProperty({ description: 'Absolute viscosity of the oil at the film temperature, reyn (lbf·s/in²)', example: 0.0000122 })
  @IsFiniteNumberIn(1e-12, 1)
  viscosityReyn: number;
  @ApiProperty({ description: 'Radial load on the bearing, lbf', example: 112500 }) @IsFiniteNumberIn(0.001, 1e9) loadLbf: number;
}
export class JournalFrictionResponseDto implements JournalFrictionResponse {
  @ApiProperty({ description: 'Petroff friction torque, lbf·in' }) frictionTorqueLbfIn: number;
  @ApiProperty({ description: 'Petroff friction coefficient f = 2π²(μN/P)(r/c)' }) frictionCoefficient: number;
  @ApiProperty({ description: 'Power lost in the bearing, hp' }) powerLossHp: number;
  @ApiProperty({ description: 'Power lost in the bearing, kW' }) powerLossKw: number;
  @ApiProperty({ description: 'Sommerfeld number S = (r/c)²·μN/P' }) sommerfeldNumber: number;
  @ApiProperty({ description: 'Load on the projected area W/(D·L), psi' }) unitLoadPsi: number;
  @ApiProperty() method: string;
}

export class LiftPressureRequestDto implements LiftPressureRequest {
  @ApiProperty({ description: 'Load on the journal to be lifted, lbf', example: 112500 }) @IsFiniteNumberIn(0.001, 1e9) loadLbf: number;
  @ApiProperty({ description: 'Area of the oil pocket (or the projected journal area), in²', example: 75 })
  @IsFiniteNumberIn(0.001, 1e6)
  pocketAreaIn2: number;
  @ApiPropertyOptional({ description: 'Breakaway factor on the lift pressure for the pump (1.5–3 usual; 2 by default)', example: 2 })
  @IsOptional()
  @IsFiniteNumberIn(1, 10)
  breakawayFactor?: number;
}
export class LiftPressureResponseDto implements LiftPressureResponse {
  @ApiProperty({ description: 'Load ÷ area, psi' }) liftPressurePsi: number;
  @ApiProperty({ description: 'Lift pressure × breakaway factor, psi' }) pumpPressurePsi: number;
  @ApiProperty() breakawayFactor: number;
  @ApiProperty({ description: 'Lift pressure × 1.5 and × 3, psi' }) pumpPressureRangePsi: { min: number; max: number };
  @ApiProperty() rule: string;
  @ApiProperty() caution: string;
}

export class JackCapacityRequestDto implements JackCapacityRequest {
  @ApiProperty({ description: 'Number of jacks carrying the load', example: 4 })
  @IsInt({ message: 'jackCount must be a whole number' })
  @Min(1, { message: 'jackCount must be at least 1' })
  @Max(64, { message: 'jackCount must be at most 64' })
  jackCount: number;
  @ApiProperty({ description: 'Rated capacity of each jack, short tons (2000 lb)', example: 50 })
  @IsFiniteNumberIn(0.001, 10_000)
  jackCapacityShortTons: number;
  @ApiProperty({ description: 'Load to be lifted, lbf', example: 225000 }) @IsFiniteNumberIn(0.001, 1e9) loadLbf: number;
  @ApiPropertyOptional({ description: 'Least acceptable capacity ÷ load (1.5 by default)', example: 1.5 })
  @IsOptional()
  @IsFiniteNumberIn(1, 10)
  requiredMargin?: number;
}
export class JackCapacityResponseDto implements JackCapacityResponse {
  @ApiProperty({ description: 'short tons' }) capacityShortTons: number;
  @ApiProperty({ description: 'short tons' }) loadShortTons: number;
  @ApiProperty({ description: 'capacity ÷ load' }) margin: number;
  @ApiProperty() requiredMargin: number;
  @ApiProperty() belowRequiredMargin: boolean;
  @ApiProperty() rule: string;
  @ApiProperty() caution: string;
}
