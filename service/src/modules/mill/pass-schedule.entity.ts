import { Column, CreateDateColumn, Entity, Index, OneToMany, PrimaryGeneratedColumn, UpdateDateColumn } from 'typeorm';
import type { ProductShape, SectionDto } from '@crankjournal/shared-types';
import { numeric } from '../../common/transformers/numeric.transformer.js';
import { SchedulePass } from './schedule-pass.entity.js';

/** A pass schedule for a product from a stock size; a template is a schedule kept for reuse. */
@Entity({ name: 'mill_schedules' })
export class PassSchedule {
  @PrimaryGeneratedColumn('uuid') id: string;
  @Index() @Column({ name: 'mill_id', type: 'uuid' }) millId: string;
  @Column({ type: 'varchar', length: 160 }) name: string;
  @Column({ name: 'is_template', type: 'boolean', default: false }) isTemplate: boolean;
  @Column({ type: 'boolean', default: false }) archived: boolean;
  @Column({ name: 'product_shape', type: 'varchar', length: 16 }) productShape: ProductShape;
  @Column({ name: 'product_height_mm', type: 'numeric', transformer: numeric }) productHeightMm: number;
  @Column({ name: 'product_width_mm', type: 'numeric', transformer: numeric }) productWidthMm: number;
  @Column({ name: 'steel_grade', type: 'varchar', length: 120 }) steelGrade: string;
  @Column({ name: 'carbon_pct', type: 'numeric', transformer: numeric }) carbonPct: number;
  @Column({ type: 'jsonb' }) stock: SectionDto;
  @Column({ name: 'stock_length_mm', type: 'numeric', transformer: numeric }) stockLengthMm: number;
  @Column({ name: 'template_id', type: 'uuid', nullable: true }) templateId: string | null;
  @Index() @Column({ name: 'lot_id', type: 'uuid', nullable: true }) lotId: string | null;
  @Column({ type: 'text', default: '' }) notes: string;
  @Column({ name: 'created_by', type: 'uuid' }) createdBy: string;
  @OneToMany(() => SchedulePass, (p) => p.schedule) passes?: SchedulePass[];
  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' }) createdAt: Date;
  @UpdateDateColumn({ name: 'updated_at', type: 'timestamptz' }) updatedAt: Date;
}
