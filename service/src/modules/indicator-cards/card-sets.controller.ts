import {
  Body,
  Controller,
  Get,
  HttpCode,
  HttpException,
  Param,
  Post,
  Req,
  Res,
  StreamableFile,
  UnsupportedMediaTypeException,
} from '@nestjs/common';
import { ApiBearerAuth, ApiBody, ApiConsumes, ApiOperation, ApiTags } from '@nestjs/swagger';
import type { Request, Response } from 'express';
import type { BrakeFigureDto, CardImageDto, CardSetDto, CardSetPreviewDto } from '@crankjournal/shared-types';
import { AnyRole, Roles } from '../../common/decorators/roles.decorator.js';
import { CurrentUser, type AuthUser } from '../../common/decorators/current-user.decorator.js';
import { IdParamDto } from '../../common/dto/id-param.dto.js';
import { ApiAnswer, ApiFileAnswer } from '../../common/openapi/api-answer.decorator.js';
import { CardSetsService } from './card-sets.service.js';
import { CardImagesService, readLimited } from './card-images.service.js';
import {
  AmendBrakeFigureDto,
  AmendCardDto,
  AmendCardSetDto,
  CardInputDto,
  CreateBrakeFigureDto,
  CreateCardSetDto,
  RunIdParamDto,
} from './dto/card-set.dto.js';

/** Card sets of a run: taken, added to and amended by operators and the chief engineer; read by everyone. */
@ApiTags('indicator cards')
@ApiBearerAuth()
@Controller()
export class CardSetsController {
  constructor(
    private readonly sets: CardSetsService,
    private readonly images: CardImagesService,
  ) {}

  @ApiAnswer('CardSetDto', { array: true })
  @Get('runs/:runId/card-sets')
  @AnyRole()
  @ApiOperation({ summary: "A run's card sets with their cards, results and amendments, in time order" })
  list(@Param() p: RunIdParamDto): Promise<CardSetDto[]> {
    return this.sets.list(p.runId);
  }

  @ApiAnswer('CardSetDto')
  @Post('runs/:runId/card-sets')
  @Roles('chief_engineer', 'operator')
  @ApiOperation({ summary: 'Take a card set (speed and pressures from the nearest readings unless given); broadcast to the run room' })
  create(@Param() p: RunIdParamDto, @Body() dto: CreateCardSetDto, @CurrentUser() me: AuthUser): Promise<CardSetDto> {
    return this.sets.create(p.runId, dto, me);
  }

  @ApiAnswer('CardSetPreviewDto')
  @Post('runs/:runId/card-sets/preview')
  @HttpCode(200)
  @Roles('chief_engineer', 'operator')
  @ApiOperation({ summary: 'What a card set would come to, without storing it' })
  preview(@Param() p: RunIdParamDto, @Body() dto: CreateCardSetDto): Promise<CardSetPreviewDto> {
    return this.sets.preview(p.runId, dto);
  }

  @ApiAnswer('CardSetDto')
  @Get('card-sets/:id')
  @AnyRole()
  get(@Param() p: IdParamDto): Promise<CardSetDto> {
    return this.sets.get(p.id);
  }

  @ApiAnswer('CardSetDto')
  @Post('card-sets/:id/cards')
  @Roles('chief_engineer', 'operator')
  @ApiOperation({ summary: 'Add the card of an end not yet taken' })
  addCard(@Param() p: IdParamDto, @Body() dto: CardInputDto, @CurrentUser() me: AuthUser): Promise<CardSetDto> {
    return this.sets.addCard(p.id, dto, me);
  }

  @ApiAnswer('CardSetDto')
  @Post('card-sets/:id/amendments')
  @Roles('chief_engineer', 'operator')
  @ApiOperation({ summary: "Correct a set's own figures; the old values stay with the reason, who and when" })
  amendSet(@Param() p: IdParamDto, @Body() dto: AmendCardSetDto, @CurrentUser() me: AuthUser): Promise<CardSetDto> {
    return this.sets.amendSet(p.id, dto, me);
  }

  @ApiAnswer('CardSetDto')
  @Post('cards/:id/amendments')
  @Roles('chief_engineer', 'operator')
  @ApiOperation({ summary: 'Correct a card (new figures in full, one way); the old values stay with the reason, who and when' })
  amendCard(@Param() p: IdParamDto, @Body() dto: AmendCardDto, @CurrentUser() me: AuthUser): Promise<CardSetDto> {
    return this.sets.amendCard(p.id, dto, me);
  }

  /** The photo or scan itself as the body (PNG, JPEG or WebP, checked by content), at most UPLOAD_MAX_BYTES. */
  @ApiAnswer('CardImageDto')
  @Post('runs/:runId/card-images')
  @Roles('chief_engineer', 'operator')
  @ApiConsumes('image/png', 'image/jpeg', 'image/webp')
  @ApiBody({ schema: { type: 'string', format: 'binary' } })
  @ApiOperation({ summary: 'Upload a card image (the raw image as the body); refused unless its bytes are a PNG, JPEG or WebP image' })
  async uploadImage(@Param() p: RunIdParamDto, @Req() req: Request, @CurrentUser() me: AuthUser): Promise<CardImageDto> {
    // A JSON (or form) body has already been read by the body parser: waiting for the raw stream would hang.
    const type = (req.headers['content-type'] ?? '').split(';')[0].trim().toLowerCase();
    if (!type.startsWith('image/') && type !== 'application/octet-stream') {
      req.resume();
      throw new UnsupportedMediaTypeException('Send the image itself as the body, with Content-Type image/png, image/jpeg or image/webp.');
    }
    const max = this.images.maxBytes;
    if (Number(req.headers['content-length'] ?? 0) > max) {
      req.resume();
      throw new HttpException(
        { statusCode: 413, error: 'Payload Too Large', message: `The image is larger than ${max} bytes; send a smaller photo or scan.` },
        413,
      );
    }
    const body = await readLimited(req, max);
    return this.images.upload(p.runId, body, me);
  }

  @ApiFileAnswer('image/*', 'The scanned card (PNG, JPEG or WebP)')
  @Get('card-images/:id')
  @AnyRole()
  @ApiOperation({ summary: 'A card image' })
  async image(@Param() p: IdParamDto, @Res({ passthrough: true }) res: Response): Promise<StreamableFile> {
    const { image, body } = await this.images.content(p.id);
    res.setHeader('cache-control', 'private, max-age=86400, immutable');
    res.setHeader('content-disposition', `inline; filename="card-${image.id}.${image.contentType.split('/')[1]}"`);
    return new StreamableFile(body, { type: image.contentType, length: body.length });
  }

  @ApiAnswer('BrakeFigureDto', { array: true })
  @Get('runs/:runId/brake-figures')
  @AnyRole()
  brakeFigures(@Param() p: RunIdParamDto): Promise<BrakeFigureDto[]> {
    return this.sets.brakeFigures(p.runId);
  }

  @ApiAnswer('BrakeFigureDto')
  @Post('runs/:runId/brake-figures')
  @Roles('chief_engineer', 'operator')
  @ApiOperation({ summary: 'Enter a brake or measured output figure; the run’s sets gain a mechanical efficiency' })
  addBrakeFigure(@Param() p: RunIdParamDto, @Body() dto: CreateBrakeFigureDto, @CurrentUser() me: AuthUser): Promise<BrakeFigureDto> {
    return this.sets.addBrakeFigure(p.runId, dto, me);
  }

  @ApiAnswer('BrakeFigureDto')
  @Post('brake-figures/:id/amendments')
  @Roles('chief_engineer', 'operator')
  amendBrakeFigure(@Param() p: IdParamDto, @Body() dto: AmendBrakeFigureDto, @CurrentUser() me: AuthUser): Promise<BrakeFigureDto> {
    return this.sets.amendBrakeFigure(p.id, dto, me);
  }
}
