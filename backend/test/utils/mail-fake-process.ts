import { type ChildProcess, spawn } from 'node:child_process';
import { createServer } from 'node:net';
import type { AddressInfo } from 'node:net';
import { join } from 'node:path';
import type { InboxMessage } from './mail-inbox';

const ROOT = join(__dirname, '..', '..', '..');

/** A port that was free a moment ago (bound to 0, read, closed). */
export const freePort = (): Promise<number> =>
  new Promise((resolve) => {
    const srv = createServer().listen(0, '127.0.0.1', () => {
      const { port } = srv.address() as AddressInfo;
      srv.close(() => resolve(port));
    });
  });

/**
 * The real mail fake (fakes/mail) as a process of its own on fixed ports, so a test can stop it
 * and start it again on the same ports, as a mail server that goes down and comes back.
 */
export class MailFakeProcess {
  private child: ChildProcess | null = null;

  constructor(
    readonly smtpPort: number,
    readonly webPort: number,
  ) {}

  static async onFreePorts(): Promise<MailFakeProcess> {
    return new MailFakeProcess(await freePort(), await freePort());
  }

  /** Starts the fake (once: a running one is left as it is) and waits for its health route. */
  async start(): Promise<void> {
    if (this.child && this.child.exitCode === null) return;
    const child = spawn(process.execPath, ['--import', 'tsx', 'fakes/mail/src/main.ts'], {
      cwd: ROOT,
      env: { ...process.env, SMTP_PORT: String(this.smtpPort), WEB_PORT: String(this.webPort) },
      stdio: 'ignore',
    });
    this.child = child;
    const until = Date.now() + 20_000;
    for (;;) {
      try {
        const r = await fetch(`http://127.0.0.1:${this.webPort}/health`);
        if (r.ok) return;
      } catch {
        /* not up yet */
      }
      if (child.exitCode !== null) throw new Error('the mail fake exited');
      if (Date.now() > until) throw new Error('the mail fake did not start');
      await new Promise((r) => setTimeout(r, 100));
    }
  }

  async stop(): Promise<void> {
    const child = this.child;
    this.child = null;
    if (!child || child.exitCode !== null) return;
    await new Promise<void>((resolve) => {
      child.once('exit', () => resolve());
      child.kill('SIGTERM');
    });
  }

  async messagesTo(address: string): Promise<InboxMessage[]> {
    const r = await fetch(`http://127.0.0.1:${this.webPort}/api/messages?to=${encodeURIComponent(address)}`);
    return (await r.json()) as InboxMessage[];
  }
}
