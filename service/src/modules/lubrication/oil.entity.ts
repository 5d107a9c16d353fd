import { Column, CreateDateColumn, Entity, PrimaryGeneratedColumn, UpdateDateColumn } from 'typeorm';
import { numeric } from '../../common/transformers/numeric.transformer.js';

/** An oil the engine house uses, with the two data-sheet viscosities the ASTM D341 fit needs. */
@Entity({ name: 'oils' })
export class Oil {
  @PrimaryGeneratedColumn('uuid') id: string;
  @Column({ type: 'varchar', length: 120, unique: true }) name: string;
  @Column({ type: 'varchar', length: 60 }) grade: string;
  @Column({ name: 'viscosity_40_cst', type: 'numeric', transformer: numeric }) viscosity40cSt: number;
  @Column({ name: 'viscosity_100_cst', type: 'numeric', transformer: numeric }) viscosity100cSt: number;
  @Column({ name: 'density_kg_m3_at_15c', type: 'numeric', nullable: true, transformer: numeric }) densityKgM3At15C: number | null;
  @Column({ name: 'figures_source', type: 'varchar', length: 300 }) figuresSource: string;
  @Column({ type: 'text', default: '' }) notes: string;
  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' }) createdAt: Date;
  @UpdateDateColumn({ name: 'updated_at', type: 'timestamptz' }) updatedAt: Date;
}

/** Which oil a lubrication point takes (the engine's description only names a grade in words). */
@Entity({ name: 'lubrication_point_oils' })
export class LubricationPointOil {
  @Column({ name: 'lubrication_point_id', type: 'uuid', primary: true }) lubricationPointId: string;
  @Column({ name: 'engine_id', type: 'uuid' }) engineId: string;
  @Column({ name: 'oil_id', type: 'uuid' }) oilId: string;
  @Column({ name: 'assigned_by', type: 'uuid' }) assignedBy: string;
  @UpdateDateColumn({ name: 'assigned_at', type: 'timestamptz' }) assignedAt: Date;
}
