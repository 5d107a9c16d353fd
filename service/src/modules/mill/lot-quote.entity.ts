import { Column, CreateDateColumn, Entity, Index, PrimaryGeneratedColumn } from 'typeorm';
import type { QuoteRates } from '@crankjournal/shared-types';
import type { Quote } from '../../calculations/quote.js';
import { numeric } from '../../common/transformers/numeric.transformer.js';

/** The figures a quote was made from: the site's rates at the time and the lot's hours. */
export interface QuoteInputs {
  productTonnes: number;
  engineHours: number;
  crewHours: number;
  crewSize: number;
  extraFixedCosts: { label: string; amount: number }[];
  rates: QuoteRates;
}

/** A quote for a lot, kept as made (a new quote gets the next number; none is changed afterwards). */
@Entity({ name: 'mill_quotes' })
@Index(['lotId', 'number'], { unique: true })
export class LotQuote {
  @PrimaryGeneratedColumn('uuid') id: string;
  @Column({ name: 'lot_id', type: 'uuid' }) lotId: string;
  @Column({ type: 'int' }) number: number;
  @Column({ type: 'jsonb' }) inputs: QuoteInputs;
  @Column({ type: 'jsonb' }) result: Quote;
  @Column({ type: 'numeric', transformer: numeric }) total: number;
  @Column({ type: 'varchar', length: 3 }) currency: string;
  @Column({ type: 'text', default: '' }) notes: string;
  @Column({ name: 'created_by', type: 'uuid' }) createdBy: string;
  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' }) createdAt: Date;
  @Column({ name: 'sent_at', type: 'timestamptz', nullable: true }) sentAt: Date | null;
  @Column({ name: 'sent_to', type: 'varchar', length: 254, nullable: true }) sentTo: string | null;
}
