import { Column, Entity, Index, JoinColumn, ManyToOne, PrimaryGeneratedColumn, type Relation } from 'typeorm';
import type { SectionDto } from '@crankjournal/shared-types';
import { numeric } from '../../common/transformers/numeric.transformer.js';
import { PassSchedule } from './pass-schedule.entity.js';

@Entity({ name: 'mill_schedule_passes' })
@Index(['scheduleId', 'seq'], { unique: true })
export class SchedulePass {
  @PrimaryGeneratedColumn('uuid') id: string;
  @Column({ name: 'schedule_id', type: 'uuid' }) scheduleId: string;
  @ManyToOne(() => PassSchedule, (s) => s.passes, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'schedule_id' })
  schedule?: Relation<PassSchedule>;
  /** pass number, from 1 */
  @Column({ type: 'int' }) seq: number;
  @Column({ name: 'stand_position', type: 'int' }) standPosition: number;
  @Column({ type: 'jsonb' }) entry: SectionDto;
  @Column({ type: 'jsonb' }) exit: SectionDto;
  @Column({ name: 'expected_temperature_c', type: 'numeric', transformer: numeric }) expectedTemperatureC: number;
  @Column({ type: 'text', default: '' }) notes: string;
}
