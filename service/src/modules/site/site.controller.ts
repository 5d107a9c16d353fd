import { Body, Controller, Get, Put } from '@nestjs/common';
import { ApiBearerAuth, ApiTags } from '@nestjs/swagger';
import { AnyRole, Roles } from '../../common/decorators/roles.decorator.js';
import { ApiAnswer } from '../../common/openapi/api-answer.decorator.js';
import { SiteService, type SiteSettingsView } from './site.service.js';
import { UpdateSiteSettingsDto } from './dto/site-settings.dto.js';

@ApiTags('site')
@ApiBearerAuth()
@Controller('site')
export class SiteController {
  constructor(private readonly site: SiteService) {}

  @ApiAnswer('SiteSettings')
  @Get('settings')
  @AnyRole()
  settings(): Promise<SiteSettingsView> {
    return this.site.settings();
  }

  @ApiAnswer('SiteSettings')
  @Put('settings')
  @Roles('administrator')
  update(@Body() dto: UpdateSiteSettingsDto): Promise<SiteSettingsView> {
    return this.site.update(dto);
  }
}
