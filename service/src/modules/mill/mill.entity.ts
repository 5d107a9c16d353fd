import { Column, CreateDateColumn, Entity, Index, OneToMany, PrimaryGeneratedColumn, UpdateDateColumn } from 'typeorm';
import type { MillSettings, QuoteRates } from '@crankjournal/shared-types';
import { MillStand } from './mill-stand.entity.js';

/** The rolling mill of the site, the engine that drives it, and the site settings for pass checks and quotes. */
@Entity({ name: 'mills' })
export class Mill {
  @PrimaryGeneratedColumn('uuid') id: string;
  @Index({ unique: true }) @Column({ type: 'varchar', length: 120 }) name: string;
  @Index() @Column({ name: 'engine_id', type: 'uuid' }) engineId: string;
  @Column({ type: 'text', default: '' }) notes: string;
  @Column({ type: 'jsonb' }) settings: MillSettings;
  @Column({ name: 'quote_rates', type: 'jsonb' }) quoteRates: QuoteRates;
  @OneToMany(() => MillStand, (s) => s.mill) stands?: MillStand[];
  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' }) createdAt: Date;
  @UpdateDateColumn({ name: 'updated_at', type: 'timestamptz' }) updatedAt: Date;
}
