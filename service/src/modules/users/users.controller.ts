import { Body, Controller, Get, Param, Patch, Post } from '@nestjs/common';
import { ApiBearerAuth, ApiTags } from '@nestjs/swagger';
import type { CrewMemberSummary, UserSummary } from '@crankjournal/shared-types';
import { AnyRole, Roles } from '../../common/decorators/roles.decorator.js';
import { CurrentUser, type AuthUser } from '../../common/decorators/current-user.decorator.js';
import { IdParamDto } from '../../common/dto/id-param.dto.js';
import { ApiAnswer } from '../../common/openapi/api-answer.decorator.js';
import { UsersService } from './users.service.js';
import { InviteUserDto } from './dto/invite-user.dto.js';
import { UpdateUserDto } from './dto/update-user.dto.js';

@ApiTags('users')
@ApiBearerAuth()
@Controller('users')
export class UsersController {
  constructor(private readonly users: UsersService) {}

  @ApiAnswer('UserSummary', { array: true })
  @Get()
  @Roles('administrator')
  list(): Promise<UserSummary[]> {
    return this.users.list();
  }

  /** Names and roles of the active crew, for choosing who works a run (no e-mail addresses). */
  @ApiAnswer('CrewMemberSummary', { array: true })
  @Get('crew')
  @AnyRole()
  crew(): Promise<CrewMemberSummary[]> {
    return this.users.crew();
  }

  @ApiAnswer('UserSummary')
  @Post('invitations')
  @Roles('administrator')
  invite(@Body() dto: InviteUserDto, @CurrentUser() me: AuthUser): Promise<UserSummary> {
    return this.users.invite(dto, me.id);
  }

  @ApiAnswer('UserSummary')
  @Patch(':id')
  @Roles('administrator')
  update(@Param() p: IdParamDto, @Body() dto: UpdateUserDto, @CurrentUser() me: AuthUser): Promise<UserSummary> {
    return this.users.update(p.id, dto, me.id);
  }
}
