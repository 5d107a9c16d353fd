import { ApiPropertyOptional } from '@nestjs/swagger';
import { Transform } from 'class-transformer';
import { IsBoolean, IsOptional, IsUUID } from 'class-validator';

export class AlarmQueryDto {
  @ApiPropertyOptional({ format: 'uuid', description: 'Only the alarms of this engine' })
  @IsOptional()
  @IsUUID('all', { message: 'engineId must be a UUID' })
  engineId?: string;
  @ApiPropertyOptional({ type: Boolean, description: 'true: only alarms not yet back to normal' })
  @IsOptional()
  @Transform(({ value }) => (value === 'true' ? true : value === 'false' ? false : value))
  @IsBoolean({ message: 'open must be true or false' })
  open?: boolean;
}
