import { Column, Entity, Index, PrimaryColumn } from 'typeorm';

/** A run that rolls (part of) a lot. */
@Entity({ name: 'mill_lot_runs' })
export class LotRun {
  @PrimaryColumn({ name: 'lot_id', type: 'uuid' }) lotId: string;
  @Index() @PrimaryColumn({ name: 'run_id', type: 'uuid' }) runId: string;
  @Column({ name: 'linked_by', type: 'uuid' }) linkedBy: string;
  @Column({ name: 'linked_at', type: 'timestamptz' }) linkedAt: Date;
}
