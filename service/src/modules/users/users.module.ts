import { Module } from '@nestjs/common';
import { TypeOrmModule } from '@nestjs/typeorm';
import { ClusterModule } from '../cluster/cluster.module.js';
import { UserEventsModule } from '../../common/events/user-events.js';
import { MailModule } from '../mail/mail.module.js';
import { User } from './user.entity.js';
import { Invitation } from './invitation.entity.js';
import { UsersService } from './users.service.js';
import { UsersController } from './users.controller.js';

@Module({
  imports: [TypeOrmModule.forFeature([User, Invitation]), MailModule, UserEventsModule, ClusterModule],
  providers: [UsersService],
  controllers: [UsersController],
  exports: [UsersService],
})
export class UsersModule {}
