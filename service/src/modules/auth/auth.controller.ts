import { Body, Controller, Get, HttpCode, Patch, Post, Req, Res, UseGuards } from '@nestjs/common';
import type { Request, Response } from 'express';
import { ApiBearerAuth, ApiTags, ApiBody } from '@nestjs/swagger';
import type { SessionUser, TokenPair } from '@crankjournal/shared-types';
import { Public } from '../../common/decorators/public.decorator.js';
import { AnyRole } from '../../common/decorators/roles.decorator.js';
import { CurrentUser, type AuthUser } from '../../common/decorators/current-user.decorator.js';
import { UsersService } from '../users/users.service.js';
import { ApiAnswer, ApiErrors, ApiNoContent } from '../../common/openapi/api-answer.decorator.js';
import { AuthService, type Issued } from './auth.service.js';
import { LoginDto } from './dto/login.dto.js';
import { ChangePasswordDto, SetSigningPinDto } from './dto/change-password.dto.js';
import { AcceptInvitationDto } from './dto/accept-invitation.dto.js';
import { UpdatePreferencesDto } from './dto/update-preferences.dto.js';
import { LoginThrottlerGuard } from './login-throttler.guard.js';
import { clearRefreshCookie, refreshCookieOf, setRefreshCookie } from './refresh-cookie.js';

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
  async login(@Body() dto: LoginDto, @Req() req: Request, @Res({ passthrough: true }) res: Response): Promise<TokenPair> {
    return answer(req, res, await this.auth.login(dto.email, dto.password));
  }

  @ApiAnswer('TokenPair')
  @ApiErrors(400)
  @Public()
  @Post('refresh')
  @HttpCode(200)
  async refresh(@Req() req: Request, @Res({ passthrough: true }) res: Response): Promise<TokenPair> {
    try {
      return answer(req, res, await this.auth.refresh(refreshCookieOf(req)));
    } catch (e) {
      clearRefreshCookie(req, res);
      throw e;
    }
  }

  @ApiAnswer('TokenPair')
  @Public()
  @UseGuards(LoginThrottlerGuard)
  @Post('accept-invitation')
  @HttpCode(200)
  async acceptInvitation(
    @Body() dto: AcceptInvitationDto,
    @Req() req: Request,
    @Res({ passthrough: true }) res: Response,
  ): Promise<TokenPair> {
    return answer(req, res, await this.auth.acceptInvitation(dto.token, dto.password));
  }

  @ApiNoContent()
  @ApiBearerAuth()
  @AnyRole()
  @Post('logout')
  @HttpCode(204)
  async logout(@CurrentUser() me: AuthUser, @Req() req: Request, @Res({ passthrough: true }) res: Response): Promise<void> {
    await this.auth.logout(refreshCookieOf(req), me.id);
    clearRefreshCookie(req, res);
  }

  /** Ends every sign-in of the caller, on every device: tokens and live connections. */
  @ApiNoContent()
  @ApiBearerAuth()
  @AnyRole()
  @Post('logout-everywhere')
  @HttpCode(204)
  async logoutEverywhere(@CurrentUser() me: AuthUser, @Req() req: Request, @Res({ passthrough: true }) res: Response): Promise<void> {
    await this.auth.endEverySession(me.id);
    clearRefreshCookie(req, res);
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
  @ApiErrors(429)
  @Post('password')
  @HttpCode(204)
  async changePassword(@Body() dto: ChangePasswordDto, @CurrentUser() me: AuthUser): Promise<void> {
    await this.auth.changePassword(me.id, dto.currentPassword, dto.newPassword);
  }

  @ApiNoContent()
  @ApiBearerAuth()
  @AnyRole()
  @ApiErrors(429)
  @Post('signing-pin')
  @HttpCode(204)
  async setPin(@Body() dto: SetSigningPinDto, @CurrentUser() me: AuthUser): Promise<void> {
    await this.auth.setPin(me.id, dto.currentPassword, dto.pin);
  }
}

/** The answer's body; the refresh token goes in its cookie only. */
function answer(req: Request, res: Response, issued: Issued): TokenPair {
  setRefreshCookie(req, res, issued.refresh.token, issued.refresh.expiresAt);
  return issued.pair;
}
