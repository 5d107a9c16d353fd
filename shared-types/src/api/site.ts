/** The works' own settings: its name and time zone on every printed record, and the wet-signature block. */
export interface SiteSettings {
  worksName: string;
  /** An IANA time zone name (for example Europe/London); printed records show times in it, stored times stay UTC. */
  timeZone: string;
  /** Whether the run log sheet ends with a block for a signature in ink. */
  wetSignature: boolean;
  /** The share of a quote asked as a deposit, percent (default 30). */
  depositSharePct: number;
}

/** PUT /api/site/settings (administrator): any of the fields. */
export type UpdateSiteSettingsRequest = Partial<SiteSettings>;
