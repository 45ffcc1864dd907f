import {
  DEFAULT_PUBLISHABLE_KEY,
  DEFAULT_SECRET_KEY,
  DEFAULT_WEBHOOK_SECRET,
  startPaymentsFake,
} from './payments-fake';

/**
 * The payments fake as a process (`scripts/stack/services.ts` starts it with the app's env and stops
 * it by PID). PORT (default 12111) on 127.0.0.1 only; PAYMENTS_URL is where browsers reach it;
 * PAYMENTS_WEBHOOK_URL / PAYMENTS_WEBHOOK_SECRET where and how events are posted; the API keys are
 * the app's PAYMENTS_SECRET_KEY / PAYMENTS_PUBLISHABLE_KEY; WEBHOOK_RETRY_BASE_MS the first retry;
 * PAYMENTS_STATE_FILE a JSON file that keeps the state across restarts (unset: memory only).
 */
function env(name: string): string | undefined {
  const value = process.env[name];
  return value === undefined || value === '' ? undefined : value;
}

function integer(name: string, fallback: number, min: number, max: number): number {
  const value = env(name);
  if (value === undefined) return fallback;
  const n = Number(value);
  if (!Number.isInteger(n) || n < min || n > max)
    throw new Error(`${name} must be a whole number ${min}–${max}, got ${value}`);
  return n;
}

async function main(): Promise<void> {
  const port = integer('PORT', 12111, 0, 65535);
  const fake = await startPaymentsFake({
    port,
    publicUrl: env('PAYMENTS_URL'),
    secretKey: env('PAYMENTS_SECRET_KEY') ?? DEFAULT_SECRET_KEY,
    publishableKey: env('PAYMENTS_PUBLISHABLE_KEY') ?? DEFAULT_PUBLISHABLE_KEY,
    webhookUrl: env('PAYMENTS_WEBHOOK_URL') ?? null,
    webhookSecret: env('PAYMENTS_WEBHOOK_SECRET') ?? DEFAULT_WEBHOOK_SECRET,
    webhookRetryBaseMs: integer('WEBHOOK_RETRY_BASE_MS', 1000, 1, 60_000),
    stateFile: env('PAYMENTS_STATE_FILE'),
  });
  const hooks = env('PAYMENTS_WEBHOOK_URL') ?? 'nowhere (events only stored)';
  console.log(`payments fake: on http://127.0.0.1:${fake.port} (public ${fake.url}), webhooks to ${hooks}`);
  const stateFile = env('PAYMENTS_STATE_FILE');
  console.log(
    stateFile
      ? `payments fake: state in ${stateFile} (${fake.store.intents.size} payment intents, ${fake.store.refunds.size} refunds loaded)`
      : 'payments fake: state in memory only',
  );
  let stopping = false;
  for (const sig of ['SIGINT', 'SIGTERM'] as const) {
    process.on(sig, () => {
      if (stopping) return;
      stopping = true;
      setTimeout(() => {
        console.log(`payments fake: ${sig}, server still closing after 3 s; exiting anyway`);
        process.exit(0);
      }, 3000).unref();
      void fake.close().then(() => {
        console.log(`payments fake: ${sig}, stopped`);
        process.exit(0);
      });
    });
  }
}

main().catch((err: unknown) => {
  console.error(`payments fake: ${err instanceof Error ? err.message : String(err)}`);
  process.exit(1);
});
