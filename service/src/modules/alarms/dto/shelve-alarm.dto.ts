import { ApiProperty } from '@nestjs/swagger';
import { IsInt, IsString, Max, MaxLength, Min, MinLength } from 'class-validator';
import type { ShelveAlarmRequest } from '@crankjournal/shared-types';

export class ShelveAlarmDto implements ShelveAlarmRequest {
  @ApiProperty({ example: 'Thermometer pocket being refilled' })
  @IsString()
  @MinLength(3, { message: 'reason must say why the alarm is shelved (at least 3 characters)' })
  @MaxLength(500)
  reason: string;

  @ApiProperty({ description: 'minutes, at most 24 hours' })
  @IsInt({ message: 'minutes must be a whole number' })
  @Min(1, { message: 'minutes must be at least 1' })
  @Max(24 * 60, { message: 'minutes must be at most 1440 (24 hours)' })
  minutes: number;
}
