import { Injectable, Logger, type OnModuleDestroy } from '@nestjs/common';
import nodemailer, { type Transporter } from 'nodemailer';
import { AppConfig } from '../../config/app-config.service.js';

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

/** E-mail through nodemailer (SMTP). In development and tests the SMTP server is our local inbox stand-in. */
@Injectable()
export class MailService implements OnModuleDestroy {
  private readonly logger = new Logger('Mail');
  private readonly transport: Transporter;

  constructor(private readonly config: AppConfig) {
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

  async send(mail: OutgoingMail): Promise<void> {
    await this.transport.sendMail({ from: this.config.get('MAIL_FROM'), ...mail });
    this.logger.log(`sent "${mail.subject}" to ${Array.isArray(mail.to) ? mail.to.join(', ') : mail.to}`);
  }

  onModuleDestroy() {
    this.transport.close();
  }
}
