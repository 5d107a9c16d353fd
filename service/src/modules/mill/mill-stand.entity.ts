import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn, type Relation } from 'typeorm';
import { numeric } from '../../common/transformers/numeric.transformer.js';
import { Mill } from './mill.entity.js';

@Entity({ name: 'mill_stands' })
@Index(['millId', 'position'], { unique: true })
export class MillStand {
  @PrimaryGeneratedColumn('uuid') id: string;
  @Column({ name: 'mill_id', type: 'uuid' }) millId: string;
  @ManyToOne(() => Mill, (m) => m.stands, { onDelete: 'CASCADE' }) @JoinColumn({ name: 'mill_id' }) mill?: Relation<Mill>;
  @Column({ type: 'int' }) position: number;
  @Column({ type: 'varchar', length: 80 }) name: string;
  @Column({ name: 'roll_diameter_mm', type: 'numeric', transformer: numeric }) rollDiameterMm: number;
  @Column({ name: 'barrel_length_mm', type: 'numeric', transformer: numeric }) barrelLengthMm: number;
  @Column({ name: 'roll_speed_ratio', type: 'numeric', transformer: numeric }) rollSpeedRatio: number;
  @Column({ name: 'max_separating_force_kn', type: 'numeric', transformer: numeric }) maxSeparatingForceKn: number;
  @Column({ type: 'text', default: '' }) notes: string;
}
