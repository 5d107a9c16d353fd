import { Column, Entity, PrimaryColumn, UpdateDateColumn } from 'typeorm';

/** The works' own settings (one row, id 1): its name and clock as printed on every record. */
@Entity({ name: 'site_settings' })
export class SiteSettings {
  @PrimaryColumn({ type: 'int' }) id: number;
  @Column({ name: 'works_name', type: 'varchar', length: 120 }) worksName: string;
  /** IANA zone the works lives in; stored times stay UTC, records print in this zone and name it. */
  @Column({ name: 'time_zone', type: 'varchar', length: 64 }) timeZone: string;
  /** Whether the run log sheet carries a block for a wet signature (the insurer or trustees ask for one). */
  @Column({ name: 'wet_signature', type: 'boolean', default: true }) wetSignature: boolean;
  /** The share of a quote asked as a deposit, percent. */
  @Column({ name: 'deposit_share_pct', type: 'int', default: 30 }) depositSharePct: number;
  @UpdateDateColumn({ name: 'updated_at', type: 'timestamptz' }) updatedAt: Date;
}
