import { Column, CreateDateColumn, Entity, Index, PrimaryGeneratedColumn, UpdateDateColumn, VersionColumn } from 'typeorm';
import type { LotStatus, ProductShape } from '@crankjournal/shared-types';
import { numeric } from '../../common/transformers/numeric.transformer.js';

/** A small customer lot, from the slate to dispatch. */
@Entity({ name: 'mill_lots' })
export class CustomerLot {
  @PrimaryGeneratedColumn('uuid') id: string;
  @Index({ unique: true }) @Column({ type: 'varchar', length: 24 }) reference: string;
  @Column({ name: 'customer_name', type: 'varchar', length: 160 }) customerName: string;
  @Column({ name: 'customer_email', type: 'varchar', length: 254 }) customerEmail: string;
  @Column({ name: 'customer_contact', type: 'varchar', length: 160, default: '' }) customerContact: string;
  @Column({ name: 'product_shape', type: 'varchar', length: 16 }) productShape: ProductShape;
  @Column({ name: 'product_height_mm', type: 'numeric', transformer: numeric }) productHeightMm: number;
  @Column({ name: 'product_width_mm', type: 'numeric', transformer: numeric }) productWidthMm: number;
  @Column({ name: 'steel_grade', type: 'varchar', length: 120 }) steelGrade: string;
  @Column({ name: 'carbon_pct', type: 'numeric', nullable: true, transformer: numeric }) carbonPct: number | null;
  @Column({ name: 'quantity_tonnes', type: 'numeric', transformer: numeric }) quantityTonnes: number;
  @Column({ name: 'due_date', type: 'date' }) dueDate: string;
  @Index() @Column({ type: 'varchar', length: 16, default: 'on_the_slate' }) status: LotStatus;
  @Column({ name: 'produced_tonnes', type: 'numeric', default: 0, transformer: numeric }) producedTonnes: number;
  @Column({ name: 'scrapped_tonnes', type: 'numeric', default: 0, transformer: numeric }) scrappedTonnes: number;
  @Column({ name: 'mill_id', type: 'uuid', nullable: true }) millId: string | null;
  @Column({ type: 'text', default: '' }) notes: string;
  @Column({ name: 'created_by', type: 'uuid' }) createdBy: string;
  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' }) createdAt: Date;
  @UpdateDateColumn({ name: 'updated_at', type: 'timestamptz' }) updatedAt: Date;
  @VersionColumn() version: number;
}
