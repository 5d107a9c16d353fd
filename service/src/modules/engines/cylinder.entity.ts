import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn, type Relation } from 'typeorm';
import type { CylinderRole } from '@crankjournal/shared-types';
import { numeric } from '../../common/transformers/numeric.transformer.js';
import { Engine } from './engine.entity.js';

@Entity({ name: 'cylinders' })
export class Cylinder {
  @PrimaryGeneratedColumn('uuid') id: string;
  @Index() @Column({ name: 'engine_id', type: 'uuid' }) engineId: string;
  @ManyToOne(() => Engine, (e) => e.cylinders, { onDelete: 'CASCADE' }) @JoinColumn({ name: 'engine_id' }) engine?: Relation<Engine>;
  @Column({ type: 'varchar', length: 40 }) label: string;
  @Column({ type: 'varchar', length: 16 }) role: CylinderRole;
  @Column({ name: 'bore_in', type: 'numeric', transformer: numeric }) boreIn: number;
  @Column({ name: 'stroke_in', type: 'numeric', transformer: numeric }) strokeIn: number;
  @Column({ name: 'piston_rod_in', type: 'numeric', transformer: numeric }) pistonRodIn: number;
  @Column({ name: 'tail_rod_in', type: 'numeric', default: 0, transformer: numeric }) tailRodIn: number;
  @Column({ name: 'clearance_percent', type: 'numeric', default: 0, transformer: numeric }) clearancePercent: number;
  @Column({ type: 'int', default: 0 }) position: number;
  /** False once left out of the engine's description: retired, kept for the records that refer to it. */
  @Column({ type: 'boolean', default: true }) active: boolean;
}
