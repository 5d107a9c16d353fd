import { Body, Controller, Delete, Get, HttpCode, Param, Post, Put, Query, Res, StreamableFile } from '@nestjs/common';
import { ApiBearerAuth, ApiTags } from '@nestjs/swagger';
import type { Response } from 'express';
import type { ChecklistTemplateDetail, ChecklistTemplateSummary, ChecklistTemplateVersionDto } from '@crankjournal/shared-types';
import { AnyRole, Roles } from '../../common/decorators/roles.decorator.js';
import { CurrentUser, type AuthUser } from '../../common/decorators/current-user.decorator.js';
import { IdParamDto } from '../../common/dto/id-param.dto.js';
import { ApiAnswer, ApiFileAnswer } from '../../common/openapi/api-answer.decorator.js';
import { ChecklistTemplatesService } from './checklist-templates.service.js';
import { ChecklistPdfService } from './checklist-pdf.service.js';
import {
  ChecklistTemplateContentDto,
  CreateChecklistTemplateDto,
  IssueChecklistTemplateDto,
  TemplateQueryDto,
  TemplateVersionParamDto,
} from './dto/template.dto.js';

/** Checklist templates: everyone reads and prints them; the chief engineer writes, issues and withdraws them. */
@ApiTags('checklists')
@ApiBearerAuth()
@Controller('checklist-templates')
export class ChecklistTemplatesController {
  constructor(
    private readonly templates: ChecklistTemplatesService,
    private readonly pdf: ChecklistPdfService,
  ) {}

  @ApiAnswer('ChecklistTemplateSummary', { array: true })
  @Get()
  @AnyRole()
  list(@Query() q: TemplateQueryDto): Promise<ChecklistTemplateSummary[]> {
    return this.templates.list(q);
  }

  @ApiAnswer('ChecklistTemplateDetail')
  @Post()
  @Roles('chief_engineer')
  create(@Body() dto: CreateChecklistTemplateDto, @CurrentUser() me: AuthUser): Promise<ChecklistTemplateDetail> {
    return this.templates.create(dto, me);
  }

  @ApiAnswer('ChecklistTemplateDetail')
  @Get(':id')
  @AnyRole()
  detail(@Param() p: IdParamDto): Promise<ChecklistTemplateDetail> {
    return this.templates.detail(p.id);
  }

  @ApiAnswer('ChecklistTemplateVersionDto')
  @Get(':id/versions/:version')
  @AnyRole()
  version(@Param() p: TemplateVersionParamDto): Promise<ChecklistTemplateVersionDto> {
    return this.templates.version(p.id, p.version);
  }

  /** Saves the chief engineer's changes as the revision in preparation, without issuing them. */
  @ApiAnswer('ChecklistTemplateDetail')
  @Put(':id/draft')
  @Roles('chief_engineer')
  saveDraft(
    @Param() p: IdParamDto,
    @Body() dto: ChecklistTemplateContentDto,
    @CurrentUser() me: AuthUser,
  ): Promise<ChecklistTemplateDetail> {
    return this.templates.saveDraft(p.id, dto, me);
  }

  @ApiAnswer('ChecklistTemplateDetail')
  @Delete(':id/draft')
  @Roles('chief_engineer')
  discardDraft(@Param() p: IdParamDto): Promise<ChecklistTemplateDetail> {
    return this.templates.discardDraft(p.id);
  }

  /** Issue: the revision in preparation becomes the next version. */
  @ApiAnswer('ChecklistTemplateDetail')
  @Post(':id/issue')
  @HttpCode(200)
  @Roles('chief_engineer')
  issue(@Param() p: IdParamDto, @Body() dto: IssueChecklistTemplateDto, @CurrentUser() me: AuthUser): Promise<ChecklistTemplateDetail> {
    return this.templates.issue(p.id, dto.changeNote ?? '', me);
  }

  /** Withdraw: no run may use the template until it is reissued. */
  @ApiAnswer('ChecklistTemplateDetail')
  @Post(':id/withdraw')
  @HttpCode(200)
  @Roles('chief_engineer')
  withdraw(@Param() p: IdParamDto): Promise<ChecklistTemplateDetail> {
    return this.templates.setWithdrawn(p.id, true);
  }

  /** Reissue: a withdrawn template is back in use at its current version. */
  @ApiAnswer('ChecklistTemplateDetail')
  @Post(':id/reissue')
  @HttpCode(200)
  @Roles('chief_engineer')
  reissue(@Param() p: IdParamDto): Promise<ChecklistTemplateDetail> {
    return this.templates.setWithdrawn(p.id, false);
  }

  /** The printable blank checklist of the current version (or the revision in preparation while nothing is issued). */
  @ApiFileAnswer('application/pdf', 'The blank checklist as a printable PDF')
  @Get(':id/blank.pdf')
  @AnyRole()
  async blank(@Param() p: IdParamDto, @CurrentUser() user: AuthUser, @Res({ passthrough: true }) res: Response): Promise<StreamableFile> {
    const { filename, buffer } = await this.pdf.blank(p.id, undefined, user.displayName);
    res.setHeader('content-disposition', `attachment; filename="${filename}"`);
    return new StreamableFile(buffer, { type: 'application/pdf' });
  }

  @ApiFileAnswer('application/pdf', 'That version of the blank checklist as a printable PDF')
  @Get(':id/versions/:version/blank.pdf')
  @AnyRole()
  async blankVersion(
    @Param() p: TemplateVersionParamDto,
    @CurrentUser() user: AuthUser,
    @Res({ passthrough: true }) res: Response,
  ): Promise<StreamableFile> {
    await this.templates.versionRow(p.id, p.version);
    const { filename, buffer } = await this.pdf.blank(p.id, p.version, user.displayName);
    res.setHeader('content-disposition', `attachment; filename="${filename}"`);
    return new StreamableFile(buffer, { type: 'application/pdf' });
  }
}
