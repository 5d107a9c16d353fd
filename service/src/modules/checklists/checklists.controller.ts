import {
  Body,
  Controller,
  Get,
  HttpCode,
  HttpException,
  Param,
  Post,
  Put,
  Req,
  Res,
  StreamableFile,
  UnsupportedMediaTypeException,
} from '@nestjs/common';
import { ApiBearerAuth, ApiBody, ApiConsumes, ApiTags } from '@nestjs/swagger';
import type { Request, Response } from 'express';
import type { ChecklistDetail, RunChecklistsOverview } from '@crankjournal/shared-types';
import { AnyRole, Roles } from '../../common/decorators/roles.decorator.js';
import { CurrentUser, type AuthUser } from '../../common/decorators/current-user.decorator.js';
import { IdParamDto } from '../../common/dto/id-param.dto.js';
import { AppConfig } from '../../config/app-config.service.js';
import { ApiAnswer, ApiErrors, ApiFileAnswer } from '../../common/openapi/api-answer.decorator.js';
import { ChecklistsService } from './checklists.service.js';
import {
  AmendChecklistDto,
  ChecklistItemParamDto,
  FillChecklistItemDto,
  OverrideChecklistItemDto,
  SignChecklistDto,
  StartChecklistDto,
} from './dto/checklist.dto.js';

/** Reads a raw request body, refusing it (413) once it passes `limit` bytes. */
export async function readBody(req: Request, limit: number): Promise<Buffer> {
  const tooLarge = () =>
    new HttpException(
      {
        statusCode: 413,
        error: 'Payload Too Large',
        message: `The photo is larger than ${Math.round(limit / 1024 / 1024)} MB; take a smaller one.`,
      },
      413,
    );
  if (Number(req.headers['content-length'] ?? 0) > limit) {
    req.resume();
    throw tooLarge();
  }
  const chunks: Buffer[] = [];
  let size = 0;
  for await (const chunk of req) {
    size += (chunk as Buffer).length;
    if (size > limit) {
      req.resume();
      throw tooLarge();
    }
    chunks.push(chunk as Buffer);
  }
  return Buffer.concat(chunks);
}

/** A run's checklists on the tablet: start, fill in any order, photos, overrides, signatures, amendments. */
@ApiTags('checklists')
@ApiBearerAuth()
@Controller()
export class ChecklistsController {
  constructor(
    private readonly checklists: ChecklistsService,
    private readonly config: AppConfig,
  ) {}

  /** Every template of the run's engine with this run's progress on it, and the pre-lube freshness. */
  @ApiAnswer('RunChecklistsOverview')
  @Get('runs/:id/checklists')
  @AnyRole()
  overview(@Param() p: IdParamDto): Promise<RunChecklistsOverview> {
    return this.checklists.overview(p.id);
  }

  @ApiAnswer('ChecklistDetail')
  @Post('runs/:id/checklists')
  @Roles('operator', 'chief_engineer')
  start(@Param() p: IdParamDto, @Body() dto: StartChecklistDto, @CurrentUser() me: AuthUser): Promise<ChecklistDetail> {
    return this.checklists.start(p.id, dto.templateId, me);
  }

  @ApiAnswer('ChecklistDetail')
  @Get('checklists/:id')
  @AnyRole()
  detail(@Param() p: IdParamDto): Promise<ChecklistDetail> {
    return this.checklists.detail(p.id);
  }

  /** Records an item's value while the checklist is being filled (only the field of its kind; null clears it). */
  @ApiAnswer('ChecklistDetail')
  @Put('checklists/:id/items/:itemKey')
  @Roles('operator', 'chief_engineer')
  fill(@Param() p: ChecklistItemParamDto, @Body() dto: FillChecklistItemDto, @CurrentUser() me: AuthUser): Promise<ChecklistDetail> {
    return this.checklists.fill(p.id, p.itemKey, dto, me);
  }

  /** A photo for a photo item, sent as the raw body (PNG, JPEG or WebP, judged by content). */
  @ApiAnswer('ChecklistDetail')
  @Put('checklists/:id/items/:itemKey/photo')
  @ApiConsumes('image/png', 'image/jpeg', 'image/webp')
  @ApiBody({ description: 'The photo as the body (PNG, JPEG or WebP)', schema: { type: 'string', format: 'binary' } })
  @Roles('operator', 'chief_engineer')
  async photoUpload(@Param() p: ChecklistItemParamDto, @Req() req: Request, @CurrentUser() me: AuthUser): Promise<ChecklistDetail> {
    const type = (req.headers['content-type'] ?? '').split(';')[0].trim().toLowerCase();
    if (!type.startsWith('image/') && type !== 'application/octet-stream') {
      req.resume();
      throw new UnsupportedMediaTypeException('Send the photo itself as the body, with Content-Type image/png, image/jpeg or image/webp.');
    }
    const body = await readBody(req, this.config.get('UPLOAD_MAX_BYTES'));
    return this.checklists.putPhoto(p.id, p.itemKey, body, me);
  }

  @ApiFileAnswer('image/*', "The item's photo (PNG, JPEG or WebP)")
  @Get('checklists/:id/items/:itemKey/photo')
  @AnyRole()
  async photo(@Param() p: ChecklistItemParamDto, @Res({ passthrough: true }) res: Response): Promise<StreamableFile> {
    const { body, type } = await this.checklists.photo(p.id, p.itemKey);
    res.setHeader('cache-control', 'private, max-age=3600');
    res.setHeader('content-disposition', 'inline');
    return new StreamableFile(body, { type });
  }

  /** The chief engineer accepts an out-of-range value with a reason (part of the record). */
  @ApiAnswer('ChecklistDetail')
  @Post('checklists/:id/items/:itemKey/override')
  @HttpCode(200)
  @Roles('chief_engineer')
  override(
    @Param() p: ChecklistItemParamDto,
    @Body() dto: OverrideChecklistItemDto,
    @CurrentUser() me: AuthUser,
  ): Promise<ChecklistDetail> {
    return this.checklists.override(p.id, p.itemKey, dto.reason, me);
  }

  /** Signs with the signer's password or PIN given again; needs the template's qualification. */
  @ApiAnswer('ChecklistDetail')
  @ApiErrors(429)
  @Post('checklists/:id/sign')
  @HttpCode(200)
  @Roles('operator', 'chief_engineer')
  sign(@Param() p: IdParamDto, @Body() dto: SignChecklistDto, @CurrentUser() me: AuthUser): Promise<ChecklistDetail> {
    return this.checklists.sign(p.id, dto.signature, me, dto.signedOnDeviceAt);
  }

  /** Corrects a signed checklist; the value as signed stays in the record. */
  @ApiAnswer('ChecklistDetail')
  @Post('checklists/:id/amendments')
  @Roles('operator', 'chief_engineer')
  amend(@Param() p: IdParamDto, @Body() dto: AmendChecklistDto, @CurrentUser() me: AuthUser): Promise<ChecklistDetail> {
    return this.checklists.amend(p.id, dto, me);
  }
}
