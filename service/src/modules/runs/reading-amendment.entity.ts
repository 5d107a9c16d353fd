import { Column, Entity, Index, PrimaryGeneratedColumn } from 'typeorm';

@Entity({ name: 'reading_amendments' })
/** A client id names one amendment (the tablet's outbox may send it again). */
@Index('uq_reading_amendments_client_id', ['clientId'], { unique: true, where: '"client_id" IS NOT NULL' })
export class ReadingAmendment {
  @PrimaryGeneratedColumn('uuid') id: string;
  @Index() @Column({ name: 'reading_id', type: 'bigint' }) readingId: string;
  @Column({ name: 'old_value', type: 'double precision' }) oldValue: number;
  @Column({ name: 'new_value', type: 'double precision' }) newValue: number;
  @Column({ type: 'text' }) reason: string;
  @Column({ name: 'by_user', type: 'uuid' }) byUser: string;
  @Column({ type: 'timestamptz' }) at: Date;
  /** The client's id of the amendment (unique where given), so a resend from the tablet's outbox is stored once. */
  @Column({ name: 'client_id', type: 'uuid', nullable: true }) clientId: string | null;
}
