import { Transform } from 'class-transformer';
import { IsBoolean, IsOptional, IsUUID } from 'class-validator';

export class AlarmQueryDto {
  @IsOptional() @IsUUID('all', { message: 'engineId must be a UUID' }) engineId?: string;
  @IsOptional()
  @Transform(({ value }) => (value === 'true' ? true : value === 'false' ? false : value))
  @IsBoolean({ message: 'open must be true or false' })
  open?: boolean;
}
