import { Module } from '@nestjs/common';
import { TypeOrmModule } from '@nestjs/typeorm';
import { MillModule } from '../mill/mill.module.js';
import { MailModule } from '../mail/mail.module.js';
import { LiveModule } from '../live/live.module.js';
import { SiteModule } from '../site/site.module.js';
import { UsersModule } from '../users/users.module.js';
import { Payment, PaymentEvent, PaymentRefund } from './payment.entity.js';
import { PaymentsService } from './payments.service.js';
import { ReceiptPdfService } from './receipt-pdf.service.js';
import { PaymentsController } from './payments.controller.js';

/** Deposits, balances and refunds for customer lots through the hosted payment service. */
@Module({
  imports: [TypeOrmModule.forFeature([Payment, PaymentRefund, PaymentEvent]), MillModule, MailModule, SiteModule, UsersModule, LiveModule],
  providers: [PaymentsService, ReceiptPdfService],
  controllers: [PaymentsController],
  exports: [PaymentsService],
})
export class PaymentsModule {}
