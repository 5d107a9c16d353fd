import {
  Body,
  Controller,
  Get,
  HttpCode,
  Param,
  Patch,
  Post,
  Query,
  Res,
  StreamableFile,
  UploadedFile,
  UseInterceptors,
} from '@nestjs/common';
import { FileInterceptor } from '@nestjs/platform-express';
import { ApiBearerAuth, ApiBody, ApiConsumes, ApiOperation, ApiTags } from '@nestjs/swagger';
import type { Response } from 'express';
import type {
  AttachmentDto,
  BearingHistory,
  BearingListItem,
  DueList,
  InspectionDto,
  InspectionPlanDto,
  InspectionSummary,
  WorkRecordDto,
  WorkRecordSummary,
} from '@crankjournal/shared-types';
import { AnyRole, Roles } from '../../common/decorators/roles.decorator.js';
import { CurrentUser, type AuthUser } from '../../common/decorators/current-user.decorator.js';
import { IdParamDto } from '../../common/dto/id-param.dto.js';
import { DUE_RULE_TEXT } from '../../calculations/maintenance-due.js';
import { ApiAnswer, ApiFileAnswer } from '../../common/openapi/api-answer.decorator.js';
import { PlansService } from './plans.service.js';
import { InspectionsService } from './inspections.service.js';
import { WorkRecordsService } from './work-records.service.js';
import { BearingHistoryService } from './bearing-history.service.js';
import { BearingHistoryExportsService } from './bearing-history-exports.service.js';
import { PlanQueryDto, PlanUpdateDto, PlanWriteDto } from './dto/plan.dto.js';
import { AttachmentUploadDto, InspectionCreateDto, InspectionQueryDto } from './dto/inspection.dto.js';
import { CloseWorkRecordDto, WorkRecordCreateDto, WorkRecordQueryDto, WorkRecordUpdateDto } from './dto/work-record.dto.js';

/** Who may write maintenance records: the maintenance lead and the chief engineer (everyone signed in reads). */
const WRITERS = ['maintenance_lead', 'chief_engineer'] as const;

@ApiTags('maintenance')
@ApiBearerAuth()
@Controller('maintenance')
export class MaintenanceController {
  constructor(
    private readonly plans: PlansService,
    private readonly inspections: InspectionsService,
    private readonly work: WorkRecordsService,
    private readonly history: BearingHistoryService,
    private readonly exports: BearingHistoryExportsService,
  ) {}

  // --- Bearings ---------------------------------------------------------------------------------

  @ApiAnswer('BearingListItem', { array: true })
  @Get('bearings')
  @AnyRole()
  @ApiOperation({ summary: 'Every bearing with its run count and drift flags' })
  bearings(): Promise<BearingListItem[]> {
    return this.history.list();
  }

  @ApiAnswer('BearingHistory')
  @Get('bearings/:id/history')
  @AnyRole()
  @ApiOperation({
    summary: 'A bearing’s runs (peak, mean, rise above ambient, speed, IHP, alarms), the drift flag with its rule, inspections and work',
  })
  bearingHistory(@Param() p: IdParamDto): Promise<BearingHistory> {
    return this.history.history(p.id);
  }

  @ApiFileAnswer('text/csv', 'The bearing history as CSV (one row per run)')
  @Get('bearings/:id/history.csv')
  @AnyRole()
  async bearingHistoryCsv(@Param() p: IdParamDto, @Res({ passthrough: true }) res: Response): Promise<StreamableFile> {
    const { filename, stream } = await this.exports.csv(p.id);
    res.setHeader('content-disposition', `attachment; filename="${filename}"`);
    return new StreamableFile(stream, { type: 'text/csv; charset=utf-8' });
  }

  @ApiFileAnswer('application/pdf', 'The bearing history as a PDF report')
  @Get('bearings/:id/history.pdf')
  @AnyRole()
  async bearingHistoryPdf(
    @Param() p: IdParamDto,
    @CurrentUser() me: AuthUser,
    @Res({ passthrough: true }) res: Response,
  ): Promise<StreamableFile> {
    const { filename, buffer } = await this.exports.pdf(p.id, me.displayName);
    res.setHeader('content-disposition', `attachment; filename="${filename}"`);
    return new StreamableFile(buffer, { type: 'application/pdf' });
  }

  // --- Plans and the due list ---------------------------------------------------------------------

  @ApiAnswer('DueList')
  @Get('due')
  @AnyRole()
  @ApiOperation({ summary: 'Active inspection plans, overrun first', description: DUE_RULE_TEXT })
  due(@Query() q: PlanQueryDto): Promise<DueList> {
    return this.plans.dueList(q.engineId);
  }

  @ApiAnswer('InspectionPlanDto', { array: true })
  @Get('plans')
  @AnyRole()
  listPlans(@Query() q: PlanQueryDto): Promise<InspectionPlanDto[]> {
    return this.plans.list(q);
  }

  @ApiAnswer('InspectionPlanDto')
  @Get('plans/:id')
  @AnyRole()
  getPlan(@Param() p: IdParamDto): Promise<InspectionPlanDto> {
    return this.plans.dto(p.id);
  }

  @ApiAnswer('InspectionPlanDto')
  @Post('plans')
  @Roles(...WRITERS)
  @ApiOperation({ summary: 'Plan an inspection by running hours, revolutions and/or calendar days', description: DUE_RULE_TEXT })
  createPlan(@Body() dto: PlanWriteDto, @CurrentUser() me: AuthUser): Promise<InspectionPlanDto> {
    return this.plans.create(dto, me.id);
  }

  @ApiAnswer('InspectionPlanDto')
  @Patch('plans/:id')
  @Roles(...WRITERS)
  updatePlan(@Param() p: IdParamDto, @Body() dto: PlanUpdateDto): Promise<InspectionPlanDto> {
    return this.plans.update(p.id, dto);
  }

  // --- Inspections ----------------------------------------------------------------------------------

  @ApiAnswer('InspectionSummary', { array: true })
  @Get('inspections')
  @AnyRole()
  listInspections(@Query() q: InspectionQueryDto): Promise<InspectionSummary[]> {
    return this.inspections.list(q);
  }

  @ApiAnswer('InspectionDto')
  @Get('inspections/:id')
  @AnyRole()
  getInspection(@Param() p: IdParamDto): Promise<InspectionDto> {
    return this.inspections.detail(p.id);
  }

  @ApiAnswer('InspectionDto')
  @Post('inspections')
  @Roles(...WRITERS)
  @ApiOperation({ summary: 'Record an inspection; each measurement is judged against its tolerance when recorded' })
  createInspection(@Body() dto: InspectionCreateDto, @CurrentUser() me: AuthUser): Promise<InspectionDto> {
    return this.inspections.create(dto, me.id);
  }

  @ApiAnswer('AttachmentDto')
  @Post('inspections/:id/attachments')
  @Roles(...WRITERS)
  @UseInterceptors(FileInterceptor('file'))
  @ApiConsumes('multipart/form-data')
  @ApiBody({
    schema: { type: 'object', required: ['file'], properties: { file: { type: 'string', format: 'binary' }, caption: { type: 'string' } } },
  })
  @ApiOperation({
    summary:
      'Attach a photo (PNG, JPEG, WebP, GIF) or a PDF, judged by its content; larger than UPLOAD_MAX_BYTES answers 413, anything else 415',
  })
  attach(
    @Param() p: IdParamDto,
    @UploadedFile() file: { buffer: Buffer; originalname?: string; size: number } | undefined,
    @Body() body: AttachmentUploadDto,
    @CurrentUser() me: AuthUser,
  ): Promise<AttachmentDto> {
    return this.inspections.attach(p.id, file, body.caption, me.id);
  }

  @ApiFileAnswer('application/octet-stream', 'The stored file, with the Content-Type it was uploaded with')
  @Get('attachments/:id/content')
  @AnyRole()
  async attachment(@Param() p: IdParamDto, @Res({ passthrough: true }) res: Response): Promise<StreamableFile> {
    const { attachment, body } = await this.inspections.attachmentContent(p.id);
    const disposition = attachment.kind === 'image' ? 'inline' : 'attachment';
    res.setHeader('content-disposition', `${disposition}; filename="${attachment.filename.replace(/"/g, '')}"`);
    res.setHeader('cache-control', 'private, max-age=3600');
    return new StreamableFile(body, { type: attachment.contentType });
  }

  // --- Work records ---------------------------------------------------------------------------------

  @ApiAnswer('WorkRecordSummary', { array: true })
  @Get('work-records')
  @AnyRole()
  listWork(@Query() q: WorkRecordQueryDto): Promise<WorkRecordSummary[]> {
    return this.work.list(q);
  }

  @ApiAnswer('WorkRecordDto')
  @Get('work-records/:id')
  @AnyRole()
  getWork(@Param() p: IdParamDto): Promise<WorkRecordDto> {
    return this.work.detail(p.id);
  }

  @ApiAnswer('WorkRecordDto')
  @Post('work-records')
  @Roles(...WRITERS)
  @ApiOperation({ summary: 'Record work: what, who, parts, hours, what prompted it, its hazards' })
  createWork(@Body() dto: WorkRecordCreateDto, @CurrentUser() me: AuthUser): Promise<WorkRecordDto> {
    return this.work.create(dto, me.id);
  }

  @ApiAnswer('WorkRecordDto')
  @Patch('work-records/:id')
  @Roles(...WRITERS)
  @ApiOperation({ summary: 'Correct or complete an open work record (409 once closed)' })
  updateWork(@Param() p: IdParamDto, @Body() dto: WorkRecordUpdateDto): Promise<WorkRecordDto> {
    return this.work.update(p.id, dto);
  }

  @ApiAnswer('WorkRecordDto')
  @Post('work-records/:id/close')
  @HttpCode(200)
  @Roles(...WRITERS)
  @ApiOperation({ summary: 'Close a work record; the plans it satisfies (or those named) start their intervals again from it' })
  closeWork(@Param() p: IdParamDto, @Body() dto: CloseWorkRecordDto, @CurrentUser() me: AuthUser): Promise<WorkRecordDto> {
    return this.work.close(p.id, dto, me.id);
  }
}
