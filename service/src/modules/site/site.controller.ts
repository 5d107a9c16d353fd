import { Body, Controller, Get, Put } from '@nestjs/common';
import { ApiBearerAuth, ApiTags } from '@nestjs/swagger';
import { AnyRole, Roles } from '../../common/decorators/roles.decorator.js';
import { ApiAnswerSchema } from '../../common/openapi/api-answer.decorator.js';
import { SiteService, type SiteSettingsView } from './site.service.js';
import { UpdateSiteSettingsDto } from './dto/site-settings.dto.js';

/** SiteSettingsView (site.service.ts), which is not a shared type. */
const SITE_SETTINGS_SCHEMA = {
  type: 'object',
  properties: { worksName: { type: 'string' }, timeZone: { type: 'string' }, wetSignature: { type: 'boolean' } },
  required: ['worksName', 'timeZone', 'wetSignature'],
  additionalProperties: false,
};

@ApiTags('site')
@ApiBearerAuth()
@Controller('site')
export class SiteController {
  constructor(private readonly site: SiteService) {}

  @ApiAnswerSchema(SITE_SETTINGS_SCHEMA, "The works' settings")
  @Get('settings')
  @AnyRole()
  settings(): Promise<SiteSettingsView> {
    return this.site.settings();
  }

  @ApiAnswerSchema(SITE_SETTINGS_SCHEMA, "The works' settings")
  @Put('settings')
  @Roles('administrator')
  update(@Body() dto: UpdateSiteSettingsDto): Promise<SiteSettingsView> {
    return this.site.update(dto);
  }
}
