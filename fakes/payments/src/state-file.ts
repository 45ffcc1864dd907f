import {
  closeSync,
  fchmodSync,
  fsyncSync,
  mkdirSync,
  openSync,
  readFileSync,
  renameSync,
  writeFileSync,
} from 'node:fs';
import { dirname } from 'node:path';
import type Stripe from 'stripe';
import type { IdempotentAnswer } from './api';
import type { CardDetails } from './cards';
import type { PaymentStore, StoredEvent } from './store';

/**
 * The fake's state in a JSON file (`PAYMENTS_STATE_FILE`), so a restarted fake still knows the
 * payments the app's database refers to: intents, charges, refunds, payment methods, events with
 * their delivery state, and the idempotency answers. Read once at start; rewritten whole after
 * changes (a short debounce), through `<file>.tmp` and a rename, owner-only (0600).
 */
export const STATE_VERSION = 1;

export interface SavedState {
  version: typeof STATE_VERSION;
  savedAt: string;
  intents: Stripe.PaymentIntent[];
  charges: Stripe.Charge[];
  refunds: Stripe.Refund[];
  paymentMethods: [string, CardDetails][];
  events: StoredEvent[];
  /** `[<api key> <idempotency key>, answer]`, as the API keeps them. */
  idempotency: [string, IdempotentAnswer][];
}

export class StateFileError extends Error {}

const isObject = (v: unknown): v is Record<string, unknown> =>
  typeof v === 'object' && v !== null && !Array.isArray(v);

function check(condition: boolean, what: string): asserts condition {
  if (!condition) throw new Error(what);
}

function checkObjects(list: unknown, name: string, object: string): void {
  check(Array.isArray(list), `"${name}" is not a list`);
  for (const item of list as unknown[]) {
    check(
      isObject(item) && typeof item.id === 'string' && item.object === object,
      `"${name}" holds something that is not a ${object}`,
    );
  }
}

function checkEntries(list: unknown, name: string, valid: (v: Record<string, unknown>) => boolean): void {
  check(Array.isArray(list), `"${name}" is not a list`);
  for (const item of list as unknown[]) {
    check(
      Array.isArray(item) && item.length === 2 && typeof item[0] === 'string' && isObject(item[1]),
      `"${name}" holds something that is not a [key, value] pair`,
    );
    const [key, value] = item as [string, Record<string, unknown>];
    check(valid(value), `"${name}" has an unusable entry for ${key}`);
  }
}

/** Throws with the reason when `data` is not a state this version can load. */
function validate(data: unknown): asserts data is SavedState {
  check(isObject(data), 'not a JSON object');
  check(data.version === STATE_VERSION, `version is ${String(data.version)}, expected ${STATE_VERSION}`);
  checkObjects(data.intents, 'intents', 'payment_intent');
  checkObjects(data.charges, 'charges', 'charge');
  checkObjects(data.refunds, 'refunds', 'refund');
  checkEntries(data.paymentMethods, 'paymentMethods', (v) => typeof v.outcome === 'string');
  checkEntries(
    data.idempotency,
    'idempotency',
    (v) =>
      typeof v.method === 'string' &&
      typeof v.path === 'string' &&
      typeof v.fingerprint === 'string' &&
      typeof v.status === 'number' &&
      typeof v.body === 'string' &&
      typeof v.requestId === 'string',
  );
  check(Array.isArray(data.events), '"events" is not a list');
  for (const e of data.events as unknown[]) {
    check(
      isObject(e) &&
        isObject(e.event) &&
        typeof e.event.id === 'string' &&
        ['stored', 'pending', 'delivered', 'failed'].includes(e.state as string) &&
        Array.isArray(e.deliveries) &&
        (e.nextAttemptAt === null || typeof e.nextAttemptAt === 'number'),
      '"events" holds something that is not a stored event',
    );
  }
}

/**
 * The state saved in `file`; null when there is no such file. Anything else that cannot be read
 * (bad JSON, an unknown shape, no permission) throws a `StateFileError` naming the file, so the fake
 * refuses to start rather than start empty and forget the payments in it.
 */
export function readStateFile(file: string): SavedState | null {
  let text: string;
  try {
    text = readFileSync(file, 'utf8');
  } catch (err) {
    if ((err as NodeJS.ErrnoException).code === 'ENOENT') return null;
    throw new StateFileError(
      `cannot read the state file ${file}: ${err instanceof Error ? err.message : String(err)}`,
    );
  }
  try {
    const data: unknown = JSON.parse(text);
    validate(data);
    return data;
  } catch (err) {
    const reason = (err instanceof Error ? err.message : String(err)).replace(/\s+/g, ' ');
    throw new StateFileError(
      `the state file ${file} is corrupt (${reason}); fix it, or move it away to start with no payments`,
    );
  }
}

export function snapshot(store: PaymentStore, idempotency: Map<string, IdempotentAnswer>): SavedState {
  return {
    version: STATE_VERSION,
    savedAt: new Date().toISOString(),
    intents: [...store.intents.values()],
    charges: [...store.charges.values()],
    refunds: [...store.refunds.values()],
    paymentMethods: [...store.paymentMethods.entries()],
    events: store.events,
    idempotency: [...idempotency.entries()],
  };
}

/**
 * Puts a saved state into an empty store. Events still waiting for a 2xx are due again at once,
 * as the service would go on retrying them; their attempt count carries on.
 */
export function restore(
  store: PaymentStore,
  idempotency: Map<string, IdempotentAnswer>,
  state: SavedState,
): void {
  store.reset();
  idempotency.clear();
  for (const pi of state.intents) store.intents.set(pi.id, pi);
  for (const ch of state.charges) store.charges.set(ch.id, ch);
  for (const re of state.refunds) store.refunds.set(re.id, re);
  for (const [id, card] of state.paymentMethods) store.paymentMethods.set(id, card);
  const now = Date.now();
  for (const e of state.events) {
    if (e.state === 'pending') e.nextAttemptAt = now;
    store.events.push(e);
  }
  for (const [key, answer] of state.idempotency) idempotency.set(key, answer);
}

/** Writes `text` to `file` so that a reader sees the old or the new file, never half of one. */
export function writeAtomically(file: string, text: string): void {
  const tmp = `${file}.tmp`;
  mkdirSync(dirname(file), { recursive: true });
  const fd = openSync(tmp, 'w', 0o600);
  try {
    fchmodSync(fd, 0o600); // a left-over .tmp keeps its old mode otherwise
    writeFileSync(fd, text);
    fsyncSync(fd);
  } finally {
    closeSync(fd);
  }
  renameSync(tmp, file);
}

/** Saves the state a little after each change (`changed()`); `flush()` saves now if anything changed. */
export class StateFile {
  private timer: NodeJS.Timeout | null = null;
  private dirty = false;
  private closed = false;

  constructor(
    readonly file: string,
    private readonly state: () => SavedState,
    private readonly delayMs = 50,
    private readonly onError: (err: unknown) => void = (err) =>
      console.error(
        `payments fake: cannot write the state file ${file}: ${err instanceof Error ? err.message : String(err)}`,
      ),
  ) {}

  changed(): void {
    if (this.closed) return;
    this.dirty = true;
    this.timer ??= setTimeout(() => {
      this.timer = null;
      this.flush();
    }, this.delayMs);
  }

  flush(): void {
    if (this.timer) clearTimeout(this.timer);
    this.timer = null;
    if (!this.dirty) return;
    this.dirty = false;
    try {
      writeAtomically(this.file, JSON.stringify(this.state()));
    } catch (err) {
      this.dirty = true;
      this.onError(err);
    }
  }

  /** Saves what is left and stops; later changes are not written. */
  close(): void {
    this.flush();
    this.closed = true;
  }
}
