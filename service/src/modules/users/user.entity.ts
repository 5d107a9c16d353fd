import { Column, CreateDateColumn, Entity, Index, PrimaryGeneratedColumn, UpdateDateColumn } from 'typeorm';
import type { Role, UnitSystem } from '@crankjournal/shared-types';

@Entity({ name: 'users' })
export class User {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  /** Stored lower-case. */
  @Index({ unique: true })
  @Column({ type: 'varchar', length: 254 })
  email: string;

  /** Unique among active people, whatever the case: index users_display_name_active on lower(display_name), in the migrations. */
  @Index('users_display_name_active', { synchronize: false })
  @Column({ name: 'display_name', type: 'varchar', length: 120 })
  displayName: string;

  @Column({ type: 'varchar', length: 32 })
  role: Role;

  @Column({ type: 'boolean', default: true })
  active: boolean;

  /** argon2id; null until an invited person sets a password. */
  @Column({ name: 'password_hash', type: 'varchar', length: 255, nullable: true, select: false })
  passwordHash: string | null;

  /** Optional signing PIN (argon2id), asked for again when signing a record. */
  @Column({ name: 'pin_hash', type: 'varchar', length: 255, nullable: true, select: false })
  pinHash: string | null;

  @Column({ name: 'unit_system', type: 'varchar', length: 16, default: 'imperial' })
  unitSystem: UnitSystem;

  /** Raised whenever every session must end (sign-out everywhere, password or role change, deactivation). */
  @Column({ name: 'session_version', type: 'integer', default: 1 })
  sessionVersion: number;

  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' })
  createdAt: Date;

  @UpdateDateColumn({ name: 'updated_at', type: 'timestamptz' })
  updatedAt: Date;
}
