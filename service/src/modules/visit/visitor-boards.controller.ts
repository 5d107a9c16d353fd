import {
  Body,
  Controller,
  Delete,
  Get,
  HttpCode,
  HttpException,
  Param,
  Patch,
  Post,
  Put,
  Req,
  Res,
  StreamableFile,
  UnsupportedMediaTypeException,
} from '@nestjs/common';
import { ApiBearerAuth, ApiBody, ApiConsumes, ApiOperation, ApiTags } from '@nestjs/swagger';
import type { Request, Response } from 'express';
import type { VisitorBoardDto } from '@crankjournal/shared-types';
import { Roles } from '../../common/decorators/roles.decorator.js';
import { CurrentUser, type AuthUser } from '../../common/decorators/current-user.decorator.js';
import { IdParamDto } from '../../common/dto/id-param.dto.js';
import { ApiAnswer, ApiFileAnswer } from '../../common/openapi/api-answer.decorator.js';
import { AppConfig } from '../../config/app-config.service.js';
import { readLimited } from '../indicator-cards/card-images.service.js';
import { VisitService } from './visit.service.js';
import { CreateVisitorBoardDto, UpdateVisitorBoardDto } from './dto/visitor-board.dto.js';

/** The chief engineer's side of the visitor boards: switch on and off, a new address, the story and its photo. */
@ApiTags('visitor boards')
@ApiBearerAuth()
@Controller('visitor-boards')
@Roles('chief_engineer')
export class VisitorBoardsController {
  constructor(
    private readonly visit: VisitService,
    private readonly config: AppConfig,
  ) {}

  @ApiAnswer('VisitorBoardDto', { array: true })
  @Get()
  list(): Promise<VisitorBoardDto[]> {
    return this.visit.list();
  }

  /** Switches a board on for a run, or for an engine whenever it runs (a new, unguessable address). */
  @ApiAnswer('VisitorBoardDto')
  @Post()
  create(@Body() dto: CreateVisitorBoardDto, @CurrentUser() me: AuthUser): Promise<VisitorBoardDto> {
    return this.visit.create(dto, me);
  }

  /** Switches the board on or off (off answers 404 to visitors at once), or changes its story. */
  @ApiAnswer('VisitorBoardDto')
  @Patch(':id')
  update(@Param() p: IdParamDto, @Body() dto: UpdateVisitorBoardDto): Promise<VisitorBoardDto> {
    return this.visit.update(p.id, dto);
  }

  /** A new address; the old one stops working at once. */
  @ApiAnswer('VisitorBoardDto')
  @Post(':id/slug')
  @HttpCode(200)
  changeSlug(@Param() p: IdParamDto): Promise<VisitorBoardDto> {
    return this.visit.changeSlug(p.id);
  }

  @ApiAnswer('VisitorBoardDto')
  @Put(':id/photo')
  @ApiConsumes('image/png', 'image/jpeg', 'image/webp')
  @ApiBody({ schema: { type: 'string', format: 'binary' } })
  @ApiOperation({ summary: "The story's photo (the raw image as the body); refused unless its bytes are a PNG, JPEG or WebP image" })
  async setPhoto(@Param() p: IdParamDto, @Req() req: Request): Promise<VisitorBoardDto> {
    const type = (req.headers['content-type'] ?? '').split(';')[0].trim().toLowerCase();
    if (!type.startsWith('image/') && type !== 'application/octet-stream') {
      req.resume();
      throw new UnsupportedMediaTypeException('Send the photo itself as the body, with Content-Type image/png, image/jpeg or image/webp.');
    }
    const max = this.config.get('UPLOAD_MAX_BYTES');
    if (Number(req.headers['content-length'] ?? 0) > max) {
      req.resume();
      throw new HttpException(
        { statusCode: 413, error: 'Payload Too Large', message: `The photo is larger than ${max} bytes; send a smaller one.` },
        413,
      );
    }
    return this.visit.setPhoto(p.id, await readLimited(req, max));
  }

  @ApiFileAnswer('image/*', "The story's photo")
  @Get(':id/photo')
  async photo(@Param() p: IdParamDto, @Res({ passthrough: true }) res: Response): Promise<StreamableFile> {
    const { body, contentType } = await this.visit.crewPhoto(p.id);
    res.setHeader('cache-control', 'private, no-cache');
    return new StreamableFile(body, { type: contentType, length: body.length });
  }

  @ApiAnswer('VisitorBoardDto')
  @Delete(':id/photo')
  removePhoto(@Param() p: IdParamDto): Promise<VisitorBoardDto> {
    return this.visit.removePhoto(p.id);
  }
}
