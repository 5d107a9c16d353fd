import { Injectable } from '@nestjs/common';
import { InjectRepository } from '@nestjs/typeorm';
import type { Repository } from 'typeorm';
import type { SiteSettings as SiteSettingsAnswer } from '@crankjournal/shared-types';
import { SiteSettings } from './site-settings.entity.js';

/** The settings as the API answers them (shared with the UI). */
export type SiteSettingsView = SiteSettingsAnswer;

/** The works' settings, read by every printed record. */
@Injectable()
export class SiteService {
  constructor(@InjectRepository(SiteSettings) private readonly repo: Repository<SiteSettings>) {}

  async settings(): Promise<SiteSettingsView> {
    const row = await this.repo.findOne({ where: { id: 1 } });
    return {
      worksName: row?.worksName ?? 'The works',
      timeZone: row?.timeZone ?? 'UTC',
      wetSignature: row?.wetSignature ?? true,
      depositSharePct: row?.depositSharePct ?? 30,
    };
  }

  async update(patch: Partial<SiteSettingsView>): Promise<SiteSettingsView> {
    const now = await this.settings();
    await this.repo.save(this.repo.create({ id: 1, ...now, ...patch }));
    return this.settings();
  }
}
