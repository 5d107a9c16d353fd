import { Column, CreateDateColumn, Entity, Index, OneToMany, PrimaryGeneratedColumn } from 'typeorm';
import type { CardSetCylinder, CardSetResults, FigureSource } from '@crankjournal/shared-types';
import { IndicatorCard } from './indicator-card.entity.js';

/**
 * A set of indicator cards taken together at one moment of a run (one card per cylinder end).
 * The set keeps its own copy of the cylinders' dimensions and its computed results, so later edits of
 * the engine's description do not rewrite the record. Corrections are amendments (card_record_amendments).
 */
@Entity({ name: 'card_sets' })
@Index('card_sets_run_time', ['runId', 'takenAt'])
export class CardSet {
  @PrimaryGeneratedColumn('uuid') id: string;
  @Column({ name: 'run_id', type: 'uuid' }) runId: string;
  @Column({ name: 'engine_id', type: 'uuid' }) engineId: string;
  @Column({ name: 'taken_at', type: 'timestamptz' }) takenAt: Date;
  @Column({ name: 'speed_rpm', type: 'double precision' }) speedRpm: number;
  @Column({ name: 'speed_source', type: 'varchar', length: 8 }) speedSource: FigureSource;
  @Column({ name: 'speed_reading_at', type: 'timestamptz', nullable: true }) speedReadingAt: Date | null;
  @Column({ name: 'cut_off_percent', type: 'double precision', nullable: true }) cutOffPercent: number | null;
  @Column({ name: 'throttle_pressure_psig', type: 'double precision', nullable: true }) throttlePressurePsig: number | null;
  @Column({ name: 'throttle_source', type: 'varchar', length: 8, nullable: true }) throttleSource: FigureSource | null;
  @Column({ name: 'receiver_pressure_psig', type: 'double precision', nullable: true }) receiverPressurePsig: number | null;
  @Column({ name: 'receiver_source', type: 'varchar', length: 8, nullable: true }) receiverSource: FigureSource | null;
  @Column({ name: 'vacuum_in_hg', type: 'double precision', nullable: true }) vacuumInHg: number | null;
  @Column({ name: 'vacuum_source', type: 'varchar', length: 8, nullable: true }) vacuumSource: FigureSource | null;
  /** The site barometer, inHg absolute (null: none known, the standard atmosphere is used). */
  @Column({ name: 'barometer_in_hg', type: 'double precision', nullable: true }) barometerInHg: number | null;
  @Column({ name: 'barometer_source', type: 'varchar', length: 8, nullable: true }) barometerSource: FigureSource | null;
  @Column({ type: 'text', nullable: true }) notes: string | null;
  /** The engine's cylinders when the set was taken. */
  @Column({ type: 'jsonb' }) cylinders: CardSetCylinder[];
  /** Whether the engine logs a vacuum (condensing) when the set was taken. */
  @Column({ type: 'boolean', default: true }) condensing: boolean;
  @Column({ type: 'jsonb' }) results: CardSetResults;
  @Column({ name: 'created_by', type: 'uuid' }) createdBy: string;
  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' }) createdAt: Date;
  @OneToMany(() => IndicatorCard, (c) => c.cardSet) cards?: IndicatorCard[];
}
