import { Module } from '@nestjs/common';
import { APP_FILTER, APP_GUARD, APP_PIPE } from '@nestjs/core';
import { TypeOrmModule } from '@nestjs/typeorm';
import { ThrottlerModule } from '@nestjs/throttler';
import { AppConfigModule } from './config/config.module.js';
import { AppConfig } from './config/app-config.service.js';
import { typeOrmOptions } from './database/typeorm-options.js';
import { JwtAuthGuard } from './common/guards/jwt-auth.guard.js';
import { RolesGuard } from './common/guards/roles.guard.js';
import { AllExceptionsFilter } from './common/filters/all-exceptions.filter.js';
import { CalculationInputFilter } from './common/filters/calculation-input.filter.js';
import { validationPipe } from './common/pipes/validation.pipe.js';
import { AuthModule } from './modules/auth/auth.module.js';
import { UsersModule } from './modules/users/users.module.js';
import { HealthModule } from './modules/health/health.module.js';
import { MailModule } from './modules/mail/mail.module.js';
import { StorageModule } from './modules/storage/storage.module.js';
import { LiveModule } from './modules/live/live.module.js';
import { EnginesModule } from './modules/engines/engines.module.js';
import { AlarmsModule } from './modules/alarms/alarms.module.js';
import { RunsModule } from './modules/runs/runs.module.js';
import { QualificationsModule } from './modules/qualifications/qualifications.module.js';
import { ChecklistsModule } from './modules/checklists/checklists.module.js';
import { MillModule } from './modules/mill/mill.module.js';
import { IndicatorCardsModule } from './modules/indicator-cards/indicator-cards.module.js';
import { MaintenanceModule } from './modules/maintenance/maintenance.module.js';
import { LubricationModule } from './modules/lubrication/lubrication.module.js';
import { SiteModule } from './modules/site/site.module.js';
import { PaymentsModule } from './modules/payments/payments.module.js';
import { RecordsModule } from './modules/records/records.module.js';
import { VisitModule } from './modules/visit/visit.module.js';

@Module({
  imports: [
    AppConfigModule,
    TypeOrmModule.forRootAsync({ inject: [AppConfig], useFactory: (c: AppConfig) => typeOrmOptions(c.get('DATABASE_URL')) }),
    ThrottlerModule.forRootAsync({
      inject: [AppConfig],
      // Sign-in limits (LoginThrottlerGuard gives each its key): per address and e-mail, per address, per account.
      useFactory: (c: AppConfig) => ({
        throttlers: [
          { name: 'login', ttl: 60_000, limit: c.get('LOGIN_RATE_LIMIT_PER_MINUTE') },
          { name: 'login-address', ttl: 60_000, limit: c.get('LOGIN_ADDRESS_LIMIT_PER_MINUTE') },
          { name: 'login-account', ttl: 3_600_000, limit: c.get('LOGIN_ACCOUNT_LIMIT_PER_HOUR') },
        ],
      }),
    }),
    MailModule,
    StorageModule,
    LiveModule,
    AuthModule,
    UsersModule,
    HealthModule,
    EnginesModule,
    AlarmsModule,
    RunsModule,
    QualificationsModule,
    ChecklistsModule,
    MillModule,
    IndicatorCardsModule,
    MaintenanceModule,
    LubricationModule,
    SiteModule,
    RecordsModule,
    VisitModule,
    PaymentsModule,
  ],
  providers: [
    { provide: APP_GUARD, useClass: JwtAuthGuard },
    { provide: APP_GUARD, useClass: RolesGuard },
    { provide: APP_PIPE, useValue: validationPipe },
    { provide: APP_FILTER, useClass: AllExceptionsFilter },
    { provide: APP_FILTER, useClass: CalculationInputFilter },
  ],
})
export class AppModule {}
