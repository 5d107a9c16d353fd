import { Column, CreateDateColumn, Entity, Index, PrimaryGeneratedColumn } from 'typeorm';
import type { ConsumptionMethod } from '@crankjournal/shared-types';
import { numeric } from '../../common/transformers/numeric.transformer.js';

/** Oil used by one lubrication point in one run: a quantity added, or the reservoir's levels before and after. */
@Entity({ name: 'oil_consumption_entries' })
@Index(['lubricationPointId', 'runId'])
export class OilConsumptionEntry {
  @PrimaryGeneratedColumn('uuid') id: string;
  @Column({ name: 'engine_id', type: 'uuid' }) engineId: string;
  @Index() @Column({ name: 'run_id', type: 'uuid' }) runId: string;
  @Column({ name: 'lubrication_point_id', type: 'uuid' }) lubricationPointId: string;
  @Column({ type: 'varchar', length: 8 }) method: ConsumptionMethod;
  @Column({ name: 'quantity_litres', type: 'numeric', nullable: true, transformer: numeric }) quantityLitres: number | null;
  @Column({ name: 'level_start_litres', type: 'numeric', nullable: true, transformer: numeric }) levelStartLitres: number | null;
  @Column({ name: 'level_end_litres', type: 'numeric', nullable: true, transformer: numeric }) levelEndLitres: number | null;
  @Column({ name: 'used_litres', type: 'numeric', transformer: numeric }) usedLitres: number;
  @Column({ type: 'text', default: '' }) note: string;
  @Column({ name: 'recorded_by', type: 'uuid' }) recordedBy: string;
  @CreateDateColumn({ name: 'recorded_at', type: 'timestamptz' }) recordedAt: Date;
}
