/** Where an e-mail job stands: waiting for its first try, between tries, being sent, sent, or given up. */
export type MailJobState = 'created' | 'retry' | 'active' | 'completed' | 'cancelled' | 'failed';

/** One e-mail of the durable queue, as the administrator sees it. */
export interface MailJobDto {
  id: string;
  state: MailJobState;
  /** Tries made so far (the first included). */
  tries: number;
  /** Tries allowed after the first before the job is marked failed. */
  retryLimit: number;
  to: string;
  subject: string;
  createdAt: string;
  /** When the next try is due (waiting jobs only). */
  nextTryAt: string | null;
  completedAt: string | null;
  /** What the SMTP server (or its absence) said at the last failed try. */
  lastError: string | null;
}
