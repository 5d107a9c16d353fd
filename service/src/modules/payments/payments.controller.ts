import { Body, Controller, Get, Header, Headers, HttpCode, Param, Post, Req } from '@nestjs/common';
import { ApiBearerAuth, ApiExcludeEndpoint, ApiOperation, ApiTags } from '@nestjs/swagger';
import type { Request } from 'express';
import { MONEY_ASKERS, MONEY_READERS, type LotMoney, type OutstandingLot, type PaymentWebhookAck } from '@crankjournal/shared-types';
import { Public } from '../../common/decorators/public.decorator.js';
import { Roles } from '../../common/decorators/roles.decorator.js';
import { CurrentUser, type AuthUser } from '../../common/decorators/current-user.decorator.js';
import { IdParamDto } from '../../common/dto/id-param.dto.js';
import { ApiAnswer, ApiErrors } from '../../common/openapi/api-answer.decorator.js';
import { PaymentsService } from './payments.service.js';
import { PaymentAskDto, PaymentRefundDto } from './dto/payment.dto.js';

/** Money for customer lots: asked through hosted checkout pages, told back by signed webhooks, refunded by the administrator. */
@ApiTags('payments')
@ApiBearerAuth()
@Controller('payments')
export class PaymentsController {
  constructor(private readonly payments: PaymentsService) {}

  @ApiAnswer('LotMoney')
  @Get('lots/:id')
  @Roles(...MONEY_READERS)
  lot(@Param() p: IdParamDto): Promise<LotMoney> {
    return this.payments.lotMoney(p.id);
  }

  @ApiAnswer('LotMoney')
  @Post('lots/:id/requests')
  @Roles(...MONEY_ASKERS)
  @ApiOperation({ summary: 'Ask the customer for the deposit or the balance: a checkout page, e-mailed with the quote PDF' })
  ask(@Param() p: IdParamDto, @Body() dto: PaymentAskDto, @CurrentUser() me: AuthUser): Promise<LotMoney> {
    return this.payments.ask(p.id, dto, me);
  }

  @ApiAnswer('LotMoney')
  @Post(':id/refunds')
  @HttpCode(200)
  @Roles('administrator')
  @ApiOperation({ summary: 'Refund all or part of a paid payment, with a reason' })
  refund(@Param() p: IdParamDto, @Body() dto: PaymentRefundDto, @CurrentUser() me: AuthUser): Promise<LotMoney> {
    return this.payments.refund(p.id, dto, me);
  }

  @ApiAnswer('OutstandingLot', { array: true })
  @Get('outstanding')
  @Roles('administrator')
  outstanding(): Promise<OutstandingLot[]> {
    return this.payments.outstanding();
  }

  @ApiAnswer('PaymentWebhookAck')
  @ApiErrors(400)
  @Post('webhook')
  @HttpCode(200)
  @Public()
  @ApiOperation({ summary: "The payment service's signed events (Stripe-Signature); each event id is applied once" })
  webhook(@Req() req: Request, @Headers('stripe-signature') signature?: string): Promise<PaymentWebhookAck> {
    return this.payments.webhook(req.body as Buffer | undefined, signature);
  }

  /** Where the checkout page sends the customer back to. */
  @ApiExcludeEndpoint()
  @Get('thanks')
  @Public()
  @Header('content-type', 'text/html; charset=utf-8')
  thanks(): string {
    return (
      '<!doctype html><html lang="en"><meta charset="utf-8"><title>Thank you</title>' +
      '<p>Thank you. We will e-mail you a receipt.</p></html>'
    );
  }
}
