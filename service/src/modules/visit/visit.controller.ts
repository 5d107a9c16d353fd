import { Controller, Get, Param, Res, StreamableFile, UseGuards } from '@nestjs/common';
import { ApiOperation, ApiTags } from '@nestjs/swagger';
import type { Response } from 'express';
import type { VisitorBoardView } from '@crankjournal/shared-types';
import { Public } from '../../common/decorators/public.decorator.js';
import { ApiAnswer, ApiErrors, ApiFileAnswer } from '../../common/openapi/api-answer.decorator.js';
import { VisitService } from './visit.service.js';
import { VisitRateLimitGuard } from './visit-rate-limit.guard.js';
import { SlugParamDto } from './dto/visitor-board.dto.js';

/**
 * The public visitor board: no sign-in, read only (GET only, nothing here accepts a body), its own rate limit.
 * A switched-off board and an unknown address both answer 404.
 */
@ApiTags('visit (public)')
@Controller('visit')
@Public()
@UseGuards(VisitRateLimitGuard)
export class VisitController {
  constructor(private readonly visit: VisitService) {}

  @ApiAnswer('VisitorBoardView')
  @ApiErrors(404, 429)
  @ApiOperation({ summary: 'A visitor board: the engine at work, delayed a few seconds and smoothed' })
  @Get(':slug')
  async board(@Param() p: SlugParamDto, @Res({ passthrough: true }) res: Response): Promise<VisitorBoardView> {
    res.setHeader('cache-control', 'no-store');
    return this.visit.view(p.slug);
  }

  @ApiFileAnswer('image/*', "The board's photo")
  @ApiErrors(404, 429)
  @Get(':slug/photo')
  async photo(@Param() p: SlugParamDto, @Res({ passthrough: true }) res: Response): Promise<StreamableFile> {
    const { body, contentType } = await this.visit.publicPhoto(p.slug);
    res.setHeader('cache-control', 'public, max-age=300');
    return new StreamableFile(body, { type: contentType, length: body.length });
  }
}
