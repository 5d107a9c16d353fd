import { ApiProperty, ApiPropertyOptional } from '@nestjs/swagger';
import { IsEmail, IsIn, IsInt, IsOptional, IsString, Max, MaxLength, Min, MinLength } from 'class-validator';
import { PAYMENT_KINDS, type PaymentAskRequest, type PaymentKind, type PaymentRefundRequest } from '@crankjournal/shared-types';

const MAX_MINOR = 99_999_999;

export class PaymentAskDto implements PaymentAskRequest {
  @ApiProperty({ enum: PAYMENT_KINDS })
  @IsIn(PAYMENT_KINDS, { message: `kind must be one of: ${PAYMENT_KINDS.join(', ')}` })
  kind: PaymentKind;
  @ApiPropertyOptional({ description: 'a fixed sum, minor units (pence, cents)', example: 25000 })
  @IsOptional()
  @IsInt({ message: 'amountMinor must be a whole number of minor units (pence, cents)' })
  @Min(1, { message: 'amountMinor must be at least 1' })
  @Max(MAX_MINOR)
  amountMinor?: number;
  @ApiPropertyOptional({ description: "deposit: a share of the quote other than the site's, percent", example: 30 })
  @IsOptional()
  @IsInt({ message: 'sharePct must be a whole number of percent' })
  @Min(1, { message: 'sharePct must be at least 1' })
  @Max(100, { message: 'sharePct must be at most 100' })
  sharePct?: number;
  @ApiPropertyOptional({ description: 'balance: agreed changes, plus or minus, minor units' })
  @IsOptional()
  @IsInt({ message: 'adjustmentMinor must be a whole number of minor units' })
  @Min(-MAX_MINOR)
  @Max(MAX_MINOR)
  adjustmentMinor?: number;
  @ApiPropertyOptional({ description: "defaults to the lot's customer e-mail" })
  @IsOptional()
  @IsEmail({}, { message: 'to must be an e-mail address' })
  @MaxLength(254)
  to?: string;
}

export class PaymentRefundDto implements PaymentRefundRequest {
  @ApiPropertyOptional({ description: 'minor units; the rest of the payment when left out' })
  @IsOptional()
  @IsInt({ message: 'amountMinor must be a whole number of minor units (pence, cents)' })
  @Min(1, { message: 'amountMinor must be at least 1' })
  @Max(MAX_MINOR)
  amountMinor?: number;
  @ApiProperty({ example: 'Lot withdrawn by the customer' })
  @IsString()
  @MinLength(3, { message: 'reason must say why the money goes back (at least 3 characters)' })
  @MaxLength(2000)
  reason: string;
}
