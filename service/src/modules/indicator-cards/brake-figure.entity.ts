import { Column, CreateDateColumn, Entity, Index, PrimaryGeneratedColumn } from 'typeorm';
import type { BrakeMethod } from '@crankjournal/shared-types';

/** A brake or measured output figure for a run, against which the cards' indicated power gives the mechanical efficiency. */
@Entity({ name: 'brake_figures' })
@Index('brake_figures_run_time', ['runId', 'measuredAt'])
export class BrakeFigure {
  @PrimaryGeneratedColumn('uuid') id: string;
  @Column({ name: 'run_id', type: 'uuid' }) runId: string;
  @Column({ name: 'measured_at', type: 'timestamptz' }) measuredAt: Date;
  @Column({ type: 'varchar', length: 12 }) method: BrakeMethod;
  @Column({ name: 'brake_hp', type: 'double precision' }) brakeHorsepower: number;
  @Column({ name: 'net_brake_load_lbf', type: 'double precision', nullable: true }) netBrakeLoadLbf: number | null;
  @Column({ name: 'drum_diameter_ft', type: 'double precision', nullable: true }) drumDiameterFt: number | null;
  @Column({ name: 'rope_diameter_ft', type: 'double precision', nullable: true }) ropeDiameterFt: number | null;
  @Column({ name: 'torque_lbf_ft', type: 'double precision', nullable: true }) torqueLbfFt: number | null;
  @Column({ name: 'speed_rpm', type: 'double precision', nullable: true }) speedRpm: number | null;
  @Column({ type: 'text', nullable: true }) note: string | null;
  @Column({ name: 'created_by', type: 'uuid' }) createdBy: string;
  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' }) createdAt: Date;
}
