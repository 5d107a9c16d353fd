import { Body, Controller, Delete, Get, HttpCode, Param, Patch, Post, Query, Res, StreamableFile } from '@nestjs/common';
import { ApiBearerAuth, ApiOperation, ApiTags } from '@nestjs/swagger';
import type { Response } from 'express';
import { MILL_WRITERS, MONEY_READERS, type LotDetail, type LotSummary, type QuoteDto } from '@crankjournal/shared-types';
import { AnyRole, Roles } from '../../common/decorators/roles.decorator.js';
import { CurrentUser, type AuthUser } from '../../common/decorators/current-user.decorator.js';
import { IdParamDto } from '../../common/dto/id-param.dto.js';
import { ApiAnswer, ApiFileAnswer } from '../../common/openapi/api-answer.decorator.js';
import { LotsService } from './lots.service.js';
import {
  LinkRunDto,
  LotQueryDto,
  LotRunParamDto,
  LotTransitionDto,
  LotUpdateDto,
  LotWriteDto,
  QuoteRequestDto,
  SendQuoteDto,
} from './dto/lot.dto.js';

/** Small customer lots, from the order slate to dispatch, and their quotes. */
/** Operators and the maintenance lead see no money: amounts are left out of their answers. */
const seesMoney = (me: AuthUser) => MONEY_READERS.includes(me.role);
const withoutMoney = <T extends LotSummary>(l: T): T => ({ ...l, latestQuoteTotal: null, ...('quotes' in l ? { quotes: [] } : {}) });

@ApiTags('mill')
@ApiBearerAuth()
@Controller('mill')
export class LotsController {
  constructor(private readonly lots: LotsService) {}

  @ApiAnswer('LotSummary', { array: true })
  @Get('lots')
  @AnyRole()
  async list(@Query() q: LotQueryDto, @CurrentUser() me: AuthUser): Promise<LotSummary[]> {
    const rows = await this.lots.list(q);
    return seesMoney(me) ? rows : rows.map(withoutMoney);
  }

  @ApiAnswer('LotDetail')
  @Get('lots/:id')
  @AnyRole()
  async detail(@Param() p: IdParamDto, @CurrentUser() me: AuthUser): Promise<LotDetail> {
    const lot = await this.lots.detail(p.id);
    return seesMoney(me) ? lot : withoutMoney(lot);
  }

  @ApiAnswer('LotDetail')
  @Post('lots')
  @Roles(...MILL_WRITERS)
  create(@Body() dto: LotWriteDto, @CurrentUser() me: AuthUser): Promise<LotDetail> {
    return this.lots.create(dto, me);
  }

  @ApiAnswer('LotDetail')
  @Patch('lots/:id')
  @Roles(...MILL_WRITERS)
  update(@Param() p: IdParamDto, @Body() dto: LotUpdateDto): Promise<LotDetail> {
    return this.lots.update(p.id, dto);
  }

  @ApiAnswer('LotDetail')
  @Post('lots/:id/transitions')
  @HttpCode(200)
  @Roles(...MILL_WRITERS)
  @ApiOperation({
    summary:
      'Move a lot one step: on the slate → priced → ordered → on the roll plan → rolled → passed inspection → dispatched ' +
      '(409 when skipping; an unpaid lot goes on the roll plan only by the chief engineer, with overrideReason)',
  })
  transition(@Param() p: IdParamDto, @Body() dto: LotTransitionDto, @CurrentUser() me: AuthUser): Promise<LotDetail> {
    return this.lots.transition(p.id, dto, me);
  }

  @ApiAnswer('LotDetail')
  @Post('lots/:id/runs')
  @HttpCode(200)
  @Roles(...MILL_WRITERS)
  linkRun(@Param() p: IdParamDto, @Body() dto: LinkRunDto, @CurrentUser() me: AuthUser): Promise<LotDetail> {
    return this.lots.linkRun(p.id, dto.runId, me);
  }

  @ApiAnswer('LotDetail')
  @Delete('lots/:id/runs/:runId')
  @Roles(...MILL_WRITERS)
  unlinkRun(@Param() p: LotRunParamDto): Promise<LotDetail> {
    return this.lots.unlinkRun(p.id, p.runId);
  }

  @ApiAnswer('QuoteDto', { array: true })
  @Get('lots/:id/quotes')
  @Roles(...MONEY_READERS)
  quotes(@Param() p: IdParamDto): Promise<QuoteDto[]> {
    return this.lots.quotes(p.id);
  }

  @ApiAnswer('QuoteDto')
  @Post('lots/:id/quotes')
  @Roles(...MILL_WRITERS)
  @ApiOperation({ summary: "Make a quote from the site's rates and the lot's engine and crew hours" })
  createQuote(@Param() p: IdParamDto, @Body() dto: QuoteRequestDto, @CurrentUser() me: AuthUser): Promise<QuoteDto> {
    return this.lots.createQuote(p.id, dto, me);
  }

  @ApiFileAnswer('application/pdf', 'The lot sheet as a PDF')
  @Get('quotes/:id/quote.pdf')
  @Roles(...MONEY_READERS)
  async pdf(@Param() p: IdParamDto, @CurrentUser() me: AuthUser, @Res({ passthrough: true }) res: Response): Promise<StreamableFile> {
    const { filename, buffer } = await this.lots.quotePdf(p.id, me.displayName);
    res.setHeader('content-disposition', `attachment; filename="${filename}"`);
    return new StreamableFile(buffer, { type: 'application/pdf' });
  }

  @ApiAnswer('QuoteDto')
  @Post('quotes/:id/send')
  @HttpCode(200)
  @Roles(...MILL_WRITERS)
  @ApiOperation({ summary: 'E-mail the quote as a PDF to the customer (a lot on the slate becomes priced)' })
  send(@Param() p: IdParamDto, @Body() dto: SendQuoteDto, @CurrentUser() me: AuthUser): Promise<QuoteDto> {
    return this.lots.sendQuote(p.id, dto, me);
  }
}
