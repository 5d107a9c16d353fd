import { Column, CreateDateColumn, Entity, Index, PrimaryGeneratedColumn } from 'typeorm';
import type { PassCalculationDto, SectionDto } from '@crankjournal/shared-types';
import { numeric } from '../../common/transformers/numeric.transformer.js';

/** A pass as logged during a run, with the calculation made when it was logged (kept for the record). */
@Entity({ name: 'mill_passes' })
@Index(['barId', 'passNumber'], { unique: true })
export class MillPass {
  @PrimaryGeneratedColumn('uuid') id: string;
  @Index({ unique: true, where: 'client_id IS NOT NULL' }) @Column({ name: 'client_id', type: 'uuid', nullable: true }) clientId:
    string | null;
  @Column({ name: 'bar_id', type: 'uuid' }) barId: string;
  @Index() @Column({ name: 'run_id', type: 'uuid' }) runId: string;
  @Column({ name: 'pass_number', type: 'int' }) passNumber: number;
  @Column({ name: 'stand_position', type: 'int' }) standPosition: number;
  @Column({ name: 'stand_name', type: 'varchar', length: 80 }) standName: string;
  @Column({ type: 'timestamptz' }) at: Date;
  @Column({ name: 'measured_temperature_c', type: 'numeric', transformer: numeric }) measuredTemperatureC: number;
  @Column({ type: 'jsonb' }) entry: SectionDto;
  @Column({ type: 'jsonb' }) exit: SectionDto;
  @Column({ name: 'planned_exit', type: 'jsonb', nullable: true }) plannedExit: SectionDto | null;
  @Column({ type: 'text', default: '' }) notes: string;
  @Column({ name: 'logged_by', type: 'uuid' }) loggedBy: string;
  @Column({ type: 'jsonb' }) calc: PassCalculationDto;
  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' }) createdAt: Date;
}
