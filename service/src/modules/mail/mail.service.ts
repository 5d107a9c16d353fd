import { Injectable, Logger, type OnModuleDestroy } from '@nestjs/common';
import nodemailer, { type Transporter } from 'nodemailer';
import { AppConfig } from '../../config/app-config.service.js';

export interface OutgoingMail {
  to: string | string[];
  subject: string;
  text: string;
  attachments?: { filename: string; content: Buffer; contentType?: string }[];
}

/** E-mail through nodemailer (SMTP). In development and tests the SMTP server is our local inbox stand-in. */
@Injectable()
export class MailService implements OnModuleDestroy {
  private readonly logger = new Logger('Mail');
  private readonly transport: Transporter;

  constructor(private readonly config: AppConfig) {
    this.transport = nodemailer.createTransport({
      host: config.get('SMTP_HOST'),
      port: config.get('SMTP_PORT'),
      secure: false,
      ignoreTLS: true,
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
