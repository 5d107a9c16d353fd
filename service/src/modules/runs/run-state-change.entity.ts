import { Column, Entity, Index, PrimaryGeneratedColumn } from 'typeorm';
import type { RunState } from '@crankjournal/shared-types';

@Entity({ name: 'run_state_changes' })
export class RunStateChange {
  @PrimaryGeneratedColumn('uuid') id: string;
  @Index() @Column({ name: 'run_id', type: 'uuid' }) runId: string;
  @Column({ name: 'from_state', type: 'varchar', length: 16, nullable: true }) fromState: RunState | null;
  @Column({ name: 'to_state', type: 'varchar', length: 16 }) toState: RunState;
  @Column({ name: 'by_user', type: 'uuid' }) byUser: string;
  @Column({ type: 'timestamptz' }) at: Date;
  @Column({ type: 'text', nullable: true }) note: string | null;
}
