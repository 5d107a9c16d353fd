import { Body, Controller, Get, HttpCode, Patch, Post, UseGuards } from '@nestjs/common';
import { ApiBearerAuth, ApiTags, ApiBody } from '@nestjs/swagger';
import type { SessionUser, TokenPair } from '@crankjournal/shared-types';
import { Public } from '../../common/decorators/public.decorator.js';
import { AnyRole } from '../../common/decorators/roles.decorator.js';
import { CurrentUser, type AuthUser } from '../../common/decorators/current-user.decorator.js';
import { UsersService } from '../users/users.service.js';
import { ApiAnswer, ApiNoContent } from '../../common/openapi/api-answer.decorator.js';
import { AuthService } from './auth.service.js';
import { LoginDto } from './dto/login.dto.js';
import { RefreshDto } from './dto/refresh.dto.js';
import { ChangePasswordDto, SetSigningPinDto } from './dto/change-password.dto.js';
import { AcceptInvitationDto } from './dto/accept-invitation.dto.js';
import { UpdatePreferencesDto } from './dto/update-preferences.dto.js';
import { LoginThrottlerGuard } from './login-throttler.guard.js';
import { LogoutDto } from './dto/logout.dto.js';

@ApiTags('auth')
@Controller('auth')
export class AuthController {
  constructor(
    private readonly auth: AuthService,
    private readonly users: UsersService,
  ) {}

  @ApiAnswer('TokenPair')
  @Public()
  @UseGuards(LoginThrottlerGuard)
  @ApiBody({
    type: LoginDto,
    examples: {
      demoOperator: {
        summary: 'The demo operator (demo data only)',
        value: { email: 'operator@alderforge.example', password: 'crankjournal-demo' },
      },
    },
  })
  @Post('login')
  @HttpCode(200)
  login(@Body() dto: LoginDto): Promise<TokenPair> {
    return this.auth.login(dto.email, dto.password);
  }

  @ApiAnswer('TokenPair')
  @Public()
  @Post('refresh')
  @HttpCode(200)
  refresh(@Body() dto: RefreshDto): Promise<TokenPair> {
    return this.auth.refresh(dto.refreshToken);
  }

  @ApiAnswer('TokenPair')
  @Public()
  @UseGuards(LoginThrottlerGuard)
  @Post('accept-invitation')
  @HttpCode(200)
  acceptInvitation(@Body() dto: AcceptInvitationDto): Promise<TokenPair> {
    return this.auth.acceptInvitation(dto.token, dto.password);
  }

  @ApiNoContent()
  @ApiBearerAuth()
  @AnyRole()
  @Post('logout')
  @HttpCode(204)
  async logout(@Body() dto: LogoutDto, @CurrentUser() me: AuthUser): Promise<void> {
    await this.auth.logout(dto.refreshToken, me.id);
  }

  /** Ends every sign-in of the caller, on every device: tokens and live connections. */
  @ApiNoContent()
  @ApiBearerAuth()
  @AnyRole()
  @Post('logout-everywhere')
  @HttpCode(204)
  async logoutEverywhere(@CurrentUser() me: AuthUser): Promise<void> {
    await this.auth.endEverySession(me.id);
  }

  @ApiAnswer('SessionUser')
  @ApiBearerAuth()
  @AnyRole()
  @Get('me')
  async me(@CurrentUser() me: AuthUser): Promise<SessionUser> {
    return this.auth.sessionUser(await this.users.get(me.id));
  }

  @ApiAnswer('SessionUser')
  @ApiBearerAuth()
  @AnyRole()
  @Patch('me')
  async updateMe(@Body() dto: UpdatePreferencesDto, @CurrentUser() me: AuthUser): Promise<SessionUser> {
    return this.auth.sessionUser(await this.users.updatePreferences(me.id, dto));
  }

  @ApiNoContent()
  @ApiBearerAuth()
  @AnyRole()
  @Post('password')
  @HttpCode(204)
  async changePassword(@Body() dto: ChangePasswordDto, @CurrentUser() me: AuthUser): Promise<void> {
    await this.auth.changePassword(me.id, dto.currentPassword, dto.newPassword);
  }

  @ApiNoContent()
  @ApiBearerAuth()
  @AnyRole()
  @Post('signing-pin')
  @HttpCode(204)
  async setPin(@Body() dto: SetSigningPinDto, @CurrentUser() me: AuthUser): Promise<void> {
    await this.auth.setPin(me.id, dto.currentPassword, dto.pin);
  }
}
