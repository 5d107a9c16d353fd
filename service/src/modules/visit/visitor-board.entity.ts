import { Column, CreateDateColumn, Entity, Index, PrimaryGeneratedColumn, UpdateDateColumn } from 'typeorm';
import type { VisitorBoardScope } from '@crankjournal/shared-types';

/** A public visitor board of one run, or of an engine whenever it runs. Its slug makes the address /visit/<slug>. */
@Entity({ name: 'visitor_boards' })
export class VisitorBoard {
  @PrimaryGeneratedColumn('uuid') id: string;
  @Column({ type: 'varchar', length: 8 }) scope: VisitorBoardScope;
  @Column({ name: 'engine_id', type: 'uuid' }) engineId: string;
  @Column({ name: 'run_id', type: 'uuid', nullable: true }) runId: string | null;
  /** Random, URL-safe; a new one replaces it at once. */
  @Index('visitor_boards_slug', { unique: true })
  @Column({ type: 'varchar', length: 64 })
  slug: string;
  @Column({ type: 'boolean', default: false }) enabled: boolean;
  @Column({ type: 'text', default: '' }) story: string;
  @Column({ name: 'photo_key', type: 'varchar', length: 200, nullable: true }) photoKey: string | null;
  @Column({ name: 'photo_content_type', type: 'varchar', length: 32, nullable: true }) photoContentType: string | null;
  @Column({ name: 'created_by', type: 'uuid' }) createdBy: string;
  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' }) createdAt: Date;
  @UpdateDateColumn({ name: 'updated_at', type: 'timestamptz' }) updatedAt: Date;
}
