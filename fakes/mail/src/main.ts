import { startMailFake } from './mail-fake';

/**
 * The mail fake as a process (`scripts/stack.ts` starts it, and stops it by PID): SMTP on
 * SMTP_PORT, the web inbox and the JSON inbox on WEB_PORT, both on 127.0.0.1 only.
 */
function port(name: string, fallback: number): number {
  const value = process.env[name];
  if (value === undefined || value === '') return fallback;
  const n = Number(value);
  if (!Number.isInteger(n) || n < 0 || n > 65535)
    throw new Error(`${name} must be a port number, got ${value}`);
  return n;
}

async function main(): Promise<void> {
  const fake = await startMailFake({
    smtpPort: port('SMTP_PORT', 1025),
    webPort: port('WEB_PORT', 8025),
    onMessage: (m) => console.log(`mail fake: ${m.id} to ${m.to.join(', ')}: ${m.subject}`),
  });
  console.log(`mail fake: SMTP on 127.0.0.1:${fake.smtpPort}, inbox on http://127.0.0.1:${fake.webPort}`);
  let stopping = false;
  for (const sig of ['SIGINT', 'SIGTERM'] as const) {
    process.on(sig, () => {
      if (stopping) return;
      stopping = true;
      // Whatever holds on, the process ends within a few seconds.
      setTimeout(() => {
        console.log(`mail fake: ${sig}, servers still closing after 3 s; exiting anyway`);
        process.exit(0);
      }, 3000).unref();
      void fake.close().then(() => {
        console.log(`mail fake: ${sig}, stopped`);
        process.exit(0);
      });
    });
  }
}

main().catch((err: unknown) => {
  console.error(`mail fake: ${err instanceof Error ? err.message : String(err)}`);
  process.exit(1);
});
