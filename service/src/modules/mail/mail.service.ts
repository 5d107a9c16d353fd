import { Injectable, Logger, type OnModuleDestroy, type OnModuleInit } from '@nestjs/common';
import nodemailer, { type Transporter } from 'nodemailer';
import type { EntityManager } from 'typeorm';
import type { MailJobDto, MailJobState } from '@crankjournal/shared-types';
import { AppConfig } from '../../config/app-config.service.js';
import { JobsService, type JobRow } from '../jobs/jobs.service.js';

export interface OutgoingMail {
  to: string | string[];
  subject: string;
  text: string;
  attachments?: { filename: string; content: Buffer; contentType?: string }[];
}

const LOOPBACK = /^(127\.\d+\.\d+\.\d+|::1|localhost)$/i;

/**
 * How the SMTP connection is protected: TLS from the start (SMTP_SECURE), STARTTLS required (SMTP_REQUIRE_TLS), or
 * else STARTTLS whenever the server offers it. Plain text is only for a server on this machine (the local stand-in).
 */
export function smtpTlsOptions(o: { host: string; secure: boolean; requireTls: boolean }) {
  return {
    host: o.host,
    secure: o.secure,
    requireTLS: !o.secure && o.requireTls,
    ignoreTLS: !o.secure && !o.requireTls && LOOPBACK.test(o.host),
  };
}

/** An e-mail as the queue keeps it (JSON: attachments in base64). */
interface QueuedMail {
  to: string | string[];
  subject: string;
  text: string;
  attachments?: { filename: string; contentBase64: string; contentType?: string }[];
}

/** The queue every e-mail goes through. */
export const MAIL_QUEUE = 'mail';

const errorText = (output: unknown): string | null => {
  if (!output || typeof output !== 'object') return null;
  const o = output as { message?: unknown; value?: unknown };
  if (typeof o.message === 'string') return o.message;
  return typeof o.value === 'string' ? o.value : null;
};

/**
 * E-mail through a durable queue: `send` writes a job (in the caller's transaction when given one); a worker in
 * some instance hands it to the SMTP server with nodemailer and retries with back-off while that server is away
 * (MAIL_RETRY_*). In development and tests the SMTP server is our local inbox stand-in.
 */
@Injectable()
export class MailService implements OnModuleInit, OnModuleDestroy {
  private readonly logger = new Logger('Mail');
  private readonly transport: Transporter;

  constructor(
    private readonly config: AppConfig,
    private readonly jobs: JobsService,
  ) {
    this.transport = nodemailer.createTransport({
      ...smtpTlsOptions({
        host: config.get('SMTP_HOST'),
        secure: config.get('SMTP_SECURE'),
        requireTls: config.get('SMTP_REQUIRE_TLS'),
      }),
      port: config.get('SMTP_PORT'),
      pool: true,
      maxConnections: 2,
    });
  }

  async onModuleInit() {
    await this.jobs.queue(MAIL_QUEUE, {
      retryLimit: this.config.get('MAIL_RETRY_LIMIT'),
      retryDelay: this.config.get('MAIL_RETRY_DELAY_SECONDS'),
      retryBackoff: this.config.get('MAIL_RETRY_BACKOFF'),
    });
    await this.jobs.work<QueuedMail>(MAIL_QUEUE, (mail) => this.deliver(mail));
  }

  /** Queues an e-mail; with `m`, in that transaction. Returns the job's id. */
  async send(mail: OutgoingMail, m?: EntityManager): Promise<string | null> {
    const queued: QueuedMail = {
      to: mail.to,
      subject: mail.subject,
      text: mail.text,
      ...(mail.attachments
        ? {
            attachments: mail.attachments.map((a) => ({
              filename: a.filename,
              contentBase64: a.content.toString('base64'),
              contentType: a.contentType,
            })),
          }
        : {}),
    };
    return this.jobs.send(MAIL_QUEUE, queued, {}, m);
  }

  /** One try at handing the e-mail to the SMTP server (throws when it is not there, so the queue retries). */
  private async deliver(mail: QueuedMail) {
    await this.transport.sendMail({
      from: this.config.get('MAIL_FROM'),
      to: mail.to,
      subject: mail.subject,
      text: mail.text,
      attachments: mail.attachments?.map((a) => ({
        filename: a.filename,
        content: Buffer.from(a.contentBase64, 'base64'),
        contentType: a.contentType,
      })),
    });
    this.logger.log(`sent "${mail.subject}" to ${Array.isArray(mail.to) ? mail.to.join(', ') : mail.to}`);
  }

  /** The latest e-mail jobs (waiting, retrying, sent, failed), newest first. */
  async jobList(limit = 100): Promise<MailJobDto[]> {
    const rows: JobRow[] = await this.jobs.list([MAIL_QUEUE], limit);
    return rows.map((j) => {
      const d = (j.data ?? {}) as Partial<QueuedMail>;
      const waiting = j.state === 'created' || j.state === 'retry';
      return {
        id: j.id,
        state: j.state as MailJobState,
        // The queue counts a try when it takes a job again after a failure: a job in 'retry' has failed retryCount + 1 times.
        tries: j.state === 'created' ? 0 : j.retryCount + 1,
        retryLimit: j.retryLimit,
        to: Array.isArray(d.to) ? d.to.join(', ') : (d.to ?? ''),
        subject: d.subject ?? '',
        createdAt: new Date(j.createdOn).toISOString(),
        nextTryAt: waiting ? new Date(j.startAfter).toISOString() : null,
        completedAt: j.completedOn ? new Date(j.completedOn).toISOString() : null,
        lastError: j.state === 'completed' ? null : errorText(j.output),
      };
    });
  }

  onModuleDestroy() {
    this.transport.close();
  }
}
