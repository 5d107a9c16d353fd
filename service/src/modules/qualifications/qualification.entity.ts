import { Column, CreateDateColumn, Entity, Index, PrimaryGeneratedColumn, UpdateDateColumn } from 'typeorm';
import type { Duty } from '@crankjournal/shared-types';

/**
 * A person's qualification for one duty on one engine. Never deleted: withdrawing (or renewing, which
 * withdraws the old one and grants a new one) keeps the old row for the record.
 */
@Entity({ name: 'qualifications' })
@Index('qualifications_one_standing', ['userId', 'engineId', 'duty'], { unique: true, where: 'withdrawn_at IS NULL' })
@Index(['engineId'])
export class Qualification {
  @PrimaryGeneratedColumn('uuid') id: string;
  @Column({ name: 'user_id', type: 'uuid' }) userId: string;
  @Column({ name: 'engine_id', type: 'uuid' }) engineId: string;
  @Column({ type: 'varchar', length: 24 }) duty: Duty;
  /** Calendar dates, both inclusive. */
  @Column({ name: 'granted_on', type: 'date' }) grantedOn: string;
  @Column({ name: 'expires_on', type: 'date' }) expiresOn: string;
  @Column({ type: 'text', default: '' }) notes: string;
  @Column({ name: 'granted_by', type: 'uuid' }) grantedBy: string;
  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' }) createdAt: Date;
  @UpdateDateColumn({ name: 'updated_at', type: 'timestamptz' }) updatedAt: Date;
  @Column({ name: 'withdrawn_at', type: 'timestamptz', nullable: true }) withdrawnAt: Date | null;
  @Column({ name: 'withdrawn_by', type: 'uuid', nullable: true }) withdrawnBy: string | null;
  @Column({ name: 'withdrawn_reason', type: 'text', nullable: true }) withdrawnReason: string | null;
}
