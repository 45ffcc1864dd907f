import type { AddressInfo } from 'node:net';
import { createSmtpServer } from './smtp';
import { type MailMessage, MailStore } from './store';
import { createWebServer } from './web';

export interface MailFakeOptions {
  /** 0 picks a free port (the one taken is in the result). */
  smtpPort: number;
  webPort: number;
  host?: string;
  /** How many messages are kept; the oldest goes first. */
  maxMessages?: number;
  /** Largest message accepted, in bytes. */
  sizeLimit?: number;
  /** Called with every message kept. */
  onMessage?: (message: MailMessage) => void;
}

export interface MailFake {
  smtpPort: number;
  webPort: number;
  store: MailStore;
  /** Stops both servers; resolves once neither listens any more. */
  close(): Promise<void>;
}

export const DEFAULT_MAX_MESSAGES = 500;
export const DEFAULT_SIZE_LIMIT = 10 * 1024 * 1024;

function portOf(address: string | AddressInfo | null): number {
  return typeof address === 'object' && address ? address.port : 0;
}

/** Starts the SMTP server and the web inbox; rejects when a port cannot be taken. */
export async function startMailFake(options: MailFakeOptions): Promise<MailFake> {
  const host = options.host ?? '127.0.0.1';
  const store = new MailStore(options.maxMessages ?? DEFAULT_MAX_MESSAGES);
  const smtp = createSmtpServer(store, {
    sizeLimit: options.sizeLimit ?? DEFAULT_SIZE_LIMIT,
    onMessage: options.onMessage,
  });
  await new Promise<void>((resolve, reject) => {
    smtp.once('error', reject);
    smtp.listen(options.smtpPort, host, () => {
      smtp.off('error', reject);
      resolve();
    });
  });
  const smtpPort = portOf(smtp.server.address());
  // Later SMTP errors (a client that drops the line) are the client's business, not a crash.
  smtp.on('error', () => undefined);

  const web = createWebServer(store, { smtpAddress: `${host}:${smtpPort}` });
  try {
    await new Promise<void>((resolve, reject) => {
      web.once('error', reject);
      web.listen(options.webPort, host, () => {
        web.off('error', reject);
        resolve();
      });
    });
  } catch (err) {
    await new Promise<void>((resolve) => smtp.close(() => resolve()));
    throw err;
  }
  const webPort = portOf(web.address());

  let closing: Promise<void> | null = null;
  const close = (): Promise<void> => {
    closing ??= Promise.all([
      new Promise<void>((resolve) => {
        web.close(() => resolve());
        web.closeAllConnections();
      }),
      new Promise<void>((resolve) => smtp.close(() => resolve())),
    ]).then(() => undefined);
    return closing;
  };
  return { smtpPort, webPort, store, close };
}
