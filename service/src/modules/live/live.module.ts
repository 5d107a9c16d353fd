import { Module } from '@nestjs/common';
import { UserEventsModule } from '../../common/events/user-events.js';
import { AuthModule } from '../auth/auth.module.js';
import { UsersModule } from '../users/users.module.js';
import { LiveGateway } from './live.gateway.js';
import { LiveService } from './live.service.js';
import { LiveController } from './live.controller.js';

/** The live channel. AuthModule lends the token checks (JwtService); UsersModule the active-user lookup. */
@Module({
  imports: [AuthModule, UsersModule, UserEventsModule],
  providers: [LiveGateway, LiveService],
  controllers: [LiveController],
  exports: [LiveService],
})
export class LiveModule {}
