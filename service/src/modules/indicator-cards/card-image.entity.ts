import { Column, Entity, Index, PrimaryGeneratedColumn } from 'typeorm';
import type { CardImageType } from '@crankjournal/shared-types';

/** A photo or scan of an indicator card, kept in the object store under `storage_key`. */
@Entity({ name: 'card_images' })
export class CardImage {
  @PrimaryGeneratedColumn('uuid') id: string;
  @Index() @Column({ name: 'run_id', type: 'uuid' }) runId: string;
  @Column({ name: 'storage_key', type: 'varchar', length: 200, unique: true }) storageKey: string;
  @Column({ name: 'content_type', type: 'varchar', length: 40 }) contentType: CardImageType;
  @Column({ type: 'int' }) bytes: number;
  @Column({ name: 'width_px', type: 'int' }) widthPx: number;
  @Column({ name: 'height_px', type: 'int' }) heightPx: number;
  @Column({ type: 'char', length: 64 }) sha256: string;
  @Column({ name: 'uploaded_by', type: 'uuid' }) uploadedBy: string;
  @Column({ name: 'uploaded_at', type: 'timestamptz' }) uploadedAt: Date;
}
