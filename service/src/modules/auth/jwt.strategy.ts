import { Injectable, UnauthorizedException } from '@nestjs/common';
import { PassportStrategy } from '@nestjs/passport';
import { ExtractJwt, Strategy } from 'passport-jwt';
import { AppConfig } from '../../config/app-config.service.js';
import { UsersService } from '../users/users.service.js';
import type { AuthUser } from '../../common/decorators/current-user.decorator.js';

export interface AccessTokenPayload {
  sub: string;
  role: string;
  /** The person's session version when the token was issued (absent in tokens of before: version 1). */
  sv?: number;
}

@Injectable()
export class JwtStrategy extends PassportStrategy(Strategy) {
  constructor(
    config: AppConfig,
    private readonly users: UsersService,
  ) {
    super({
      jwtFromRequest: ExtractJwt.fromAuthHeaderAsBearerToken(),
      ignoreExpiration: false,
      secretOrKey: config.get('JWT_SECRET'),
      algorithms: ['HS256'],
    });
  }

  /** Checked on every request, so the tokens of a deactivated person, or of a session that ended, stop working at once. */
  async validate(payload: AccessTokenPayload): Promise<AuthUser> {
    const user = await this.users.findActiveAuthUser(payload.sub);
    if (!user) throw new UnauthorizedException('Your account is not active. Ask an administrator.');
    if (user.sessionVersion !== (payload.sv ?? 1)) throw new UnauthorizedException('This sign-in has ended. Please sign in again.');
    return user;
  }
}
