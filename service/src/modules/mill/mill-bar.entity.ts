import { Column, CreateDateColumn, Entity, Index, PrimaryGeneratedColumn, UpdateDateColumn } from 'typeorm';
import type { SectionDto } from '@crankjournal/shared-types';
import { numeric } from '../../common/transformers/numeric.transformer.js';

/** One bar rolled during a run. */
@Entity({ name: 'mill_bars' })
@Index(['runId', 'barCode'], { unique: true })
export class MillBar {
  @PrimaryGeneratedColumn('uuid') id: string;
  @Index() @Column({ name: 'run_id', type: 'uuid' }) runId: string;
  @Column({ name: 'mill_id', type: 'uuid' }) millId: string;
  @Column({ name: 'bar_code', type: 'varchar', length: 40 }) barCode: string;
  @Column({ name: 'schedule_id', type: 'uuid', nullable: true }) scheduleId: string | null;
  @Index() @Column({ name: 'lot_id', type: 'uuid', nullable: true }) lotId: string | null;
  @Column({ type: 'jsonb' }) stock: SectionDto;
  @Column({ name: 'stock_length_mm', type: 'numeric', transformer: numeric }) stockLengthMm: number;
  @Column({ name: 'weight_kg', type: 'numeric', nullable: true, transformer: numeric }) weightKg: number | null;
  @Column({ type: 'boolean', default: false }) scrapped: boolean;
  @Column({ name: 'scrap_reason', type: 'text', nullable: true }) scrapReason: string | null;
  @Column({ type: 'text', default: '' }) notes: string;
  @Column({ name: 'created_by', type: 'uuid' }) createdBy: string;
  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' }) createdAt: Date;
  @UpdateDateColumn({ name: 'updated_at', type: 'timestamptz' }) updatedAt: Date;
}
