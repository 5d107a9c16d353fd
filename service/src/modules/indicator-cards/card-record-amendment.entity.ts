import { Column, Entity, Index, PrimaryGeneratedColumn } from 'typeorm';
import type { FieldChange } from '@crankjournal/shared-types';

export type AmendedSubject = 'card_set' | 'card' | 'brake_figure';

/** A correction of a card set, a card or a brake figure: the fields changed (old and new), why, who and when. */
@Entity({ name: 'card_record_amendments' })
@Index('card_record_amendments_subject', ['subjectType', 'subjectId', 'at'])
export class CardRecordAmendment {
  @PrimaryGeneratedColumn('uuid') id: string;
  @Column({ name: 'subject_type', type: 'varchar', length: 16 }) subjectType: AmendedSubject;
  @Column({ name: 'subject_id', type: 'uuid' }) subjectId: string;
  @Index() @Column({ name: 'run_id', type: 'uuid' }) runId: string;
  @Column({ type: 'jsonb' }) changes: FieldChange[];
  @Column({ type: 'text' }) reason: string;
  @Column({ name: 'by_user', type: 'uuid' }) byUser: string;
  @Column({ type: 'timestamptz' }) at: Date;
}
