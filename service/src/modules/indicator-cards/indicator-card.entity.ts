import { Column, CreateDateColumn, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn, type Relation } from 'typeorm';
import type { CardMethod, CardOutlinePointDto, CardTrace, CylinderEnd, TraceOrigin } from '@crankjournal/shared-types';
import { CardSet } from './card-set.entity.js';

/**
 * One card of a set: how its mean height was found (MEP typed in, planimeter area, mid-ordinates or a
 * trace on an uploaded image) and what it came to. The row holds the current figures; every earlier
 * figure stays in card_record_amendments with who, when and why.
 */
@Entity({ name: 'indicator_cards' })
@Index('indicator_cards_one_per_end', ['cardSetId', 'cylinderLabel', 'end'], { unique: true })
export class IndicatorCard {
  @PrimaryGeneratedColumn('uuid') id: string;
  @Column({ name: 'card_set_id', type: 'uuid' }) cardSetId: string;
  @ManyToOne(() => CardSet, (s) => s.cards, { onDelete: 'RESTRICT' }) @JoinColumn({ name: 'card_set_id' }) cardSet?: Relation<CardSet>;
  /** The engine's cylinder (null if it was later removed from the engine's description). */
  @Column({ name: 'cylinder_id', type: 'uuid', nullable: true }) cylinderId: string | null;
  @Column({ name: 'cylinder_label', type: 'varchar', length: 40 }) cylinderLabel: string;
  @Column({ type: 'varchar', length: 8 }) end: CylinderEnd;
  @Column({ type: 'varchar', length: 12 }) method: CardMethod;
  @Column({ name: 'spring_psi_per_in', type: 'double precision', nullable: true }) springPsiPerIn: number | null;
  @Column({ name: 'length_in', type: 'double precision', nullable: true }) lengthIn: number | null;
  @Column({ name: 'area_sq_in', type: 'double precision', nullable: true }) areaSqIn: number | null;
  @Column({ name: 'ordinates_in', type: 'double precision', array: true, nullable: true }) ordinatesIn: number[] | null;
  @Column({ name: 'given_mep_psi', type: 'double precision', nullable: true }) givenMeanEffectivePressurePsi: number | null;
  @Column({ name: 'image_id', type: 'uuid', nullable: true }) imageId: string | null;
  @Column({ type: 'jsonb', nullable: true }) trace: CardTrace | null;
  /** Where the trace came from (proposal accepted, adjusted, by hand); null without a trace or when not said. */
  @Column({ name: 'trace_origin', type: 'varchar', length: 20, nullable: true }) traceOrigin: TraceOrigin | null;
  @Column({ name: 'cut_off_percent', type: 'double precision', nullable: true }) cutOffPercent: number | null;
  @Column({ name: 'compression_percent', type: 'double precision', nullable: true }) compressionPercent: number | null;
  @Column({ name: 'admission_pressure_psig', type: 'double precision', nullable: true }) admissionPressurePsig: number | null;
  @Column({ type: 'text', nullable: true }) note: string | null;
  // Results of this card alone.
  @Column({ name: 'mean_height_in', type: 'double precision', nullable: true }) meanHeightIn: number | null;
  @Column({ name: 'mep_psi', type: 'double precision' }) meanEffectivePressurePsi: number;
  @Column({ name: 'traced_area_sq_in', type: 'double precision', nullable: true }) tracedAreaSqIn: number | null;
  @Column({ type: 'jsonb', nullable: true }) outline: CardOutlinePointDto[] | null;
  @Column({ name: 'created_by', type: 'uuid' }) createdBy: string;
  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' }) createdAt: Date;
}
