import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn, type Relation } from 'typeorm';
import type { LubricationKind } from '@crankjournal/shared-types';
import { Engine } from './engine.entity.js';

@Entity({ name: 'lubrication_points' })
export class LubricationPoint {
  @PrimaryGeneratedColumn('uuid') id: string;
  @Index() @Column({ name: 'engine_id', type: 'uuid' }) engineId: string;
  @ManyToOne(() => Engine, (e) => e.lubricationPoints, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'engine_id' })
  engine?: Relation<Engine>;
  @Column({ type: 'varchar', length: 80 }) label: string;
  @Column({ type: 'varchar', length: 24 }) kind: LubricationKind;
  @Column({ name: 'oil_grade', type: 'varchar', length: 80, default: '' }) oilGrade: string;
  @Column({ type: 'int', default: 0 }) position: number;
  /** False once left out of the engine's description: retired, kept for the records that refer to it. */
  @Column({ type: 'boolean', default: true }) active: boolean;
}
