import { Column, CreateDateColumn, Entity, Index, PrimaryGeneratedColumn } from 'typeorm';

/** A data logger allowed to push readings, with its own key (stored hashed). */
@Entity({ name: 'loggers' })
export class DataLogger {
  @PrimaryGeneratedColumn('uuid') id: string;
  @Column({ name: 'engine_id', type: 'uuid' }) engineId: string;
  @Column({ type: 'varchar', length: 80 }) name: string;
  @Column({ name: 'key_prefix', type: 'varchar', length: 12 }) keyPrefix: string;
  @Index({ unique: true }) @Column({ name: 'key_hash', type: 'char', length: 64 }) keyHash: string;
  @Column({ name: 'created_by', type: 'uuid' }) createdBy: string;
  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' }) createdAt: Date;
  @Column({ name: 'revoked_at', type: 'timestamptz', nullable: true }) revokedAt: Date | null;
  @Column({ name: 'last_seen_at', type: 'timestamptz', nullable: true }) lastSeenAt: Date | null;
}
