import { simpleParser } from 'mailparser';
import { SMTPServer, type SMTPServerDataStream, type SMTPServerSession } from 'smtp-server';
import type { MailMessage, MailStore } from './store';

export interface SmtpOptions {
  /** Largest message accepted, in bytes (advertised with the SIZE extension, RFC 1870). */
  sizeLimit: number;
  /** Called with every message kept (the process logs a line). */
  onMessage?: (message: MailMessage) => void;
}

/** An SMTP error reply: smtp-server sends `responseCode` and the message to the client. */
function smtpError(responseCode: number, message: string): Error {
  return Object.assign(new Error(message), { responseCode });
}

/**
 * The SMTP side: accepts every sender and recipient, needs no sign-in (any credentials are
 * accepted too, so a configured SMTP user does no harm), no TLS, and keeps each message in `store`.
 */
export function createSmtpServer(store: MailStore, options: SmtpOptions): SMTPServer {
  return new SMTPServer({
    name: 'mail-fake.loamline.local',
    banner: 'Loamline mail fake (local test inbox, nothing is delivered)',
    authOptional: true,
    allowInsecureAuth: true,
    disabledCommands: ['STARTTLS'],
    size: options.sizeLimit,
    rejectOversized: true,
    disableReverseLookup: true,
    logger: false,
    // Stop promptly: an idle pooled client connection is told 421 and dropped after this.
    closeTimeout: 1000,
    onAuth(auth, _session, callback) {
      callback(null, { user: auth.username ?? 'anyone' });
    },
    onData(stream: SMTPServerDataStream, session: SMTPServerSession, callback) {
      const chunks: Buffer[] = [];
      stream.on('data', (chunk: Buffer) => chunks.push(chunk));
      stream.on('error', (err: Error) => callback(err));
      stream.on('end', () => {
        if (stream.sizeExceeded) {
          // RFC 1870 §6.3: 552 when the message is larger than the server's fixed maximum.
          callback(smtpError(552, `Message exceeds the fixed maximum size of ${options.sizeLimit} bytes`));
          return;
        }
        const raw = Buffer.concat(chunks);
        const envelopeTo = session.envelope.rcptTo.map((r) => r.address);
        simpleParser(raw).then(
          (parsed) => {
            const message = store.add(parsed, raw, envelopeTo);
            options.onMessage?.(message);
            callback(null, `Message kept as ${message.id}`);
          },
          (err: unknown) => {
            const reason = err instanceof Error ? err.message : String(err);
            callback(smtpError(554, `Message could not be parsed: ${reason}`));
          },
        );
      });
    },
  });
}
