import { Injectable, Logger, type OnModuleDestroy } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';
import { createTransport, type Transporter } from 'nodemailer';
import type { MailConfig } from '../config/app.config';

export interface OutgoingMail {
  to: string;
  subject: string;
  text: string;
  html: string;
}

/** Sends e-mail over SMTP with nodemailer (locally: the mail fake in fakes/mail). */
@Injectable()
export class MailService implements OnModuleDestroy {
  private readonly logger = new Logger(MailService.name);
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

  /** For mails whose request must not wait or tell (password reset): failures are logged only. */
  sendInBackground(mail: OutgoingMail, what: string): void {
    this.send(mail).catch((err: unknown) =>
      this.logger.error(`Could not send ${what}: ${err instanceof Error ? err.message : String(err)}`),
    );
  }

  onModuleDestroy(): void {
    this.transporter.close();
  }
}
