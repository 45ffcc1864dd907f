import { Injectable, type OnApplicationShutdown } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';
import { createTransport, type Transporter } from 'nodemailer';
import type { MailConfig } from '../config/app.config';

export interface OutgoingMail {
  to: string;
  subject: string;
  text: string;
  html: string;
  /** a calendar file (RFC 5545) sent as the mail's calendar part, e.g. a confirmed appointment */
  icalEvent?: { method: 'REQUEST' | 'CANCEL'; filename: string; content: string };
}

/**
 * Sends e-mail over SMTP with nodemailer (locally: the mail fake in fakes/mail). Only the relay
 * calls it: the app's code enqueues mail in the outbox (outbox/mail-outbox.ts).
 */
@Injectable()
export class MailService implements OnApplicationShutdown {
  private readonly transporter: Transporter;
  private readonly from: string;

  constructor(config: ConfigService) {
    const mail = config.getOrThrow<MailConfig>('mail');
    this.from = mail.from;
    this.transporter = createTransport({
      host: mail.host,
      port: mail.port,
      secure: false,
      connectionTimeout: 5000,
      greetingTimeout: 5000,
      socketTimeout: 10_000,
    });
  }

  /** Resolves once the SMTP server accepted the message; rejects when it could not be sent. */
  async send(mail: OutgoingMail): Promise<void> {
    await this.transporter.sendMail({ from: this.from, ...mail });
  }

  /** After the relay stopped (it waits for its runs in onModuleDestroy). */
  onApplicationShutdown(): void {
    this.transporter.close();
  }
}
