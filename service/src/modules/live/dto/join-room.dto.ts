import { IsString, MaxLength, MinLength } from 'class-validator';
import type { JoinRoomRequest } from '@crankjournal/shared-types';

export class JoinRoomDto implements JoinRoomRequest {
  @IsString({ message: 'room must be text' })
  @MinLength(1)
  @MaxLength(100)
  room: string;
}
