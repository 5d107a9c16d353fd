import { IsUUID } from 'class-validator';

export class IdParamDto {
  @IsUUID('all', { message: 'id must be a UUID' })
  id: string;
}
