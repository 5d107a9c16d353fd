import { Column, Entity, Index, PrimaryGeneratedColumn } from 'typeorm';
import type { LotStatus } from '@crankjournal/shared-types';

@Entity({ name: 'mill_lot_status_changes' })
export class LotStatusChange {
  @PrimaryGeneratedColumn('uuid') id: string;
  @Index() @Column({ name: 'lot_id', type: 'uuid' }) lotId: string;
  @Column({ name: 'from_status', type: 'varchar', length: 16, nullable: true }) fromStatus: LotStatus | null;
  @Column({ name: 'to_status', type: 'varchar', length: 16 }) toStatus: LotStatus;
  @Column({ name: 'by_user', type: 'uuid' }) byUser: string;
  @Column({ type: 'timestamptz' }) at: Date;
  @Column({ type: 'text', nullable: true }) note: string | null;
}
