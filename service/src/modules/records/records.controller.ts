import { Controller, Get, Param, Res, StreamableFile } from '@nestjs/common';
import { ApiBearerAuth, ApiTags } from '@nestjs/swagger';
import type { Response } from 'express';
import { AnyRole } from '../../common/decorators/roles.decorator.js';
import { CurrentUser, type AuthUser } from '../../common/decorators/current-user.decorator.js';
import { IdParamDto } from '../../common/dto/id-param.dto.js';
import { ApiFileAnswer } from '../../common/openapi/api-answer.decorator.js';
import { RunLogSheetService } from './run-log-sheet.service.js';

/** Printed records that draw on several modules (the run log sheet). */
@ApiTags('runs')
@ApiBearerAuth()
@Controller('runs')
export class RecordsController {
  constructor(private readonly logSheet: RunLogSheetService) {}

  @ApiFileAnswer('application/pdf', 'The run log sheet as a PDF')
  @Get(':id/log-sheet.pdf')
  @AnyRole()
  async runLogSheet(
    @Param() p: IdParamDto,
    @CurrentUser() user: AuthUser,
    @Res({ passthrough: true }) res: Response,
  ): Promise<StreamableFile> {
    const { filename, buffer } = await this.logSheet.render(p.id, user.displayName);
    res.setHeader('content-disposition', `attachment; filename="${filename}"`);
    return new StreamableFile(buffer, { type: 'application/pdf' });
  }
}
