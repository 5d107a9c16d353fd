import { IsBoolean, IsOptional, IsString, IsUUID, Matches, MaxLength } from 'class-validator';
import type { CreateVisitorBoardRequest, UpdateVisitorBoardRequest } from '@crankjournal/shared-types';

export class CreateVisitorBoardDto implements CreateVisitorBoardRequest {
  @IsOptional() @IsUUID('all', { message: 'runId must be a UUID (the run the board follows)' }) runId?: string;
  @IsOptional() @IsUUID('all', { message: 'engineId must be a UUID (the engine the board follows whenever it runs)' }) engineId?: string;
}

export class UpdateVisitorBoardDto implements UpdateVisitorBoardRequest {
  @IsOptional() @IsBoolean({ message: 'enabled must be true (board on) or false (board off)' }) enabled?: boolean;
  @IsOptional()
  @IsString({ message: 'story must be text' })
  @MaxLength(4000, { message: 'story must be at most 4000 characters; shorten it' })
  story?: string;
}

export class SlugParamDto {
  @Matches(/^[A-Za-z0-9_-]{8,64}$/, { message: 'the address is not one of ours: check the link or scan the code again' })
  slug: string;
}
