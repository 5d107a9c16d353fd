import { Module } from '@nestjs/common';
import { TypeOrmModule } from '@nestjs/typeorm';
import { SiteSettings } from './site-settings.entity.js';
import { SiteService } from './site.service.js';
import { SiteController } from './site.controller.js';

/** The works' own settings: its name, its time zone, whether records carry a wet-signature block. */
@Module({
  imports: [TypeOrmModule.forFeature([SiteSettings])],
  providers: [SiteService],
  controllers: [SiteController],
  exports: [SiteService],
})
export class SiteModule {}
