import { Column, CreateDateColumn, Entity, Index, PrimaryGeneratedColumn } from 'typeorm';

/** Every change to a limit or engine setting: who, when, the old and the new value. */
@Entity({ name: 'limit_changes' })
export class LimitChange {
  @PrimaryGeneratedColumn('uuid') id: string;
  @Index() @Column({ name: 'engine_id', type: 'uuid' }) engineId: string;
  /** What was changed: "engine" or a point/part label. */
  @Column({ type: 'varchar', length: 160 }) subject: string;
  @Column({ type: 'varchar', length: 60 }) field: string;
  @Column({ name: 'old_value', type: 'text', nullable: true }) oldValue: string | null;
  @Column({ name: 'new_value', type: 'text', nullable: true }) newValue: string | null;
  @Column({ name: 'changed_by', type: 'uuid' }) changedBy: string;
  @CreateDateColumn({ name: 'changed_at', type: 'timestamptz' }) changedAt: Date;
}
