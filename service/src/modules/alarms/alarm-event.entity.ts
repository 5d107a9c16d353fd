import { Column, Entity, Index, PrimaryGeneratedColumn } from 'typeorm';

/** Every change of an alarm's state: who (null for the server itself), when, what. */
@Entity({ name: 'alarm_events' })
export class AlarmEvent {
  @PrimaryGeneratedColumn('uuid') id: string;
  @Index() @Column({ name: 'alarm_id', type: 'uuid' }) alarmId: string;
  @Column({ type: 'varchar', length: 24 }) event: string;
  @Column({ name: 'from_state', type: 'varchar', length: 32, nullable: true }) fromState: string | null;
  @Column({ name: 'to_state', type: 'varchar', length: 32 }) toState: string;
  @Column({ name: 'by_user', type: 'uuid', nullable: true }) byUser: string | null;
  @Column({ type: 'timestamptz' }) at: Date;
  @Column({ type: 'text', nullable: true }) note: string | null;
}
