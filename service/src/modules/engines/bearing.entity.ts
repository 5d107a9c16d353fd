import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn, type Relation } from 'typeorm';
import type { BearingKind } from '@crankjournal/shared-types';
import { numeric } from '../../common/transformers/numeric.transformer.js';
import { Engine } from './engine.entity.js';

@Entity({ name: 'bearings' })
export class Bearing {
  @PrimaryGeneratedColumn('uuid') id: string;
  @Index() @Column({ name: 'engine_id', type: 'uuid' }) engineId: string;
  @ManyToOne(() => Engine, (e) => e.bearings, { onDelete: 'CASCADE' }) @JoinColumn({ name: 'engine_id' }) engine?: Relation<Engine>;
  @Column({ type: 'varchar', length: 80 }) label: string;
  @Column({ type: 'varchar', length: 24 }) kind: BearingKind;
  @Column({ name: 'journal_diameter_in', type: 'numeric', transformer: numeric }) journalDiameterIn: number;
  @Column({ name: 'journal_length_in', type: 'numeric', transformer: numeric }) journalLengthIn: number;
  @Column({ name: 'load_share_percent', type: 'numeric', default: 0, transformer: numeric }) loadSharePercent: number;
  @Column({ name: 'radial_clearance_in', type: 'numeric', nullable: true, transformer: numeric }) radialClearanceIn: number | null;
  @Column({ name: 'lubrication_point_id', type: 'uuid', nullable: true }) lubricationPointId: string | null;
  @Column({ type: 'int', default: 0 }) position: number;
  /** False once left out of the engine's description: retired, kept for the records that refer to it. */
  @Column({ type: 'boolean', default: true }) active: boolean;
}
