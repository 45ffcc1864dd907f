import type { IncomingMessage, ServerResponse } from 'node:http';
import type Stripe from 'stripe';
import { type FormParams, type FormValue, FormError, fingerprint, parseForm } from './form';
import { API_VERSION, ApiError, type Cause, type PaymentStore, invalid, newId } from './store';

/**
 * The `/v1/…` routes the stripe SDK (server) and the fake's `stripe.js` (browser) call, on the
 * service's wire protocol: form-encoded bodies with bracket nesting, JSON answers, bearer keys,
 * `Idempotency-Key` replays, `request-id` headers and `{ error: { type, message, code, … } }`.
 */
export interface ApiKeys {
  secret: string;
  publishable: string;
}

export interface IdempotentAnswer {
  method: string;
  path: string;
  fingerprint: string;
  status: number;
  body: string;
  requestId: string;
}

export interface ApiContext {
  store: PaymentStore;
  keys: ApiKeys;
  /** Answers by `<api key> <idempotency key>`. */
  idempotency: Map<string, IdempotentAnswer>;
}

const MAX_BODY = 1024 * 1024;
const CURRENCY = /^[a-z]{3}$/;
const CANCELLATION_REASONS = ['duplicate', 'fraudulent', 'requested_by_customer', 'abandoned'] as const;
const REFUND_REASONS = ['duplicate', 'fraudulent', 'requested_by_customer'] as const;

export const CORS_HEADERS = {
  'access-control-allow-origin': '*',
  'access-control-allow-methods': 'GET, POST, OPTIONS',
  'access-control-allow-headers': 'Authorization, Content-Type, Idempotency-Key, Stripe-Version',
  'access-control-expose-headers': 'Request-Id, Idempotent-Replayed',
  'access-control-max-age': '600',
};

export function readBody(req: IncomingMessage): Promise<string> {
  return new Promise((resolve, reject) => {
    const chunks: Buffer[] = [];
    let size = 0;
    req.on('data', (chunk: Buffer) => {
      size += chunk.length;
      if (size > MAX_BODY) {
        reject(invalid('Request body too large.'));
        req.destroy();
        return;
      }
      chunks.push(chunk);
    });
    req.on('end', () => resolve(Buffer.concat(chunks).toString('utf8')));
    req.on('error', reject);
  });
}

/* ------------------------------------------------------------------ parameters */

function str(params: FormParams, name: string): string | undefined {
  const v = params[name];
  if (v === undefined) return undefined;
  if (typeof v !== 'string')
    throw invalid(`Invalid string: ${name}`, { code: 'parameter_invalid_string', param: name });
  return v;
}

function required(params: FormParams, name: string): string {
  const v = str(params, name);
  if (v === undefined || v === '') {
    throw invalid(`Missing required param: ${name}.`, { code: 'parameter_missing', param: name });
  }
  return v;
}

function int(params: FormParams, name: string): number | undefined {
  const v = str(params, name);
  if (v === undefined) return undefined;
  if (!/^-?\d+$/.test(v) || !Number.isSafeInteger(Number(v))) {
    throw invalid(`Invalid integer: ${v}`, { code: 'parameter_invalid_integer', param: name });
  }
  return Number(v);
}

function bool(params: FormParams, name: string): boolean | undefined {
  const v = str(params, name);
  if (v === undefined) return undefined;
  if (v !== 'true' && v !== 'false')
    throw invalid(`Invalid boolean: ${v}`, { code: 'parameter_invalid_boolean', param: name });
  return v === 'true';
}

function stringArray(params: FormParams, name: string): string[] | undefined {
  const v = params[name];
  if (v === undefined) return undefined;
  if (!Array.isArray(v) || v.some((x) => typeof x !== 'string')) {
    throw invalid(`Invalid array: ${name}`, { code: 'parameter_invalid_array', param: name });
  }
  return v as string[];
}

function metadata(params: FormParams): Record<string, string> | undefined {
  const v: FormValue | undefined = params.metadata;
  if (v === undefined) return undefined;
  if (v === '') return {};
  if (typeof v !== 'object' || Array.isArray(v)) throw invalid('Invalid hash', { param: 'metadata' });
  const out: Record<string, string> = {};
  const entries = Object.entries(v);
  if (entries.length > 50) throw invalid('You can have up to 50 metadata keys.', { param: 'metadata' });
  for (const [k, value] of entries) {
    if (typeof value !== 'string')
      throw invalid(`Invalid string: metadata[${k}]`, { param: `metadata[${k}]` });
    if (k.length > 40)
      throw invalid('Metadata keys can be at most 40 characters.', { param: `metadata[${k}]` });
    if (value.length > 500)
      throw invalid('Metadata values can be at most 500 characters.', { param: `metadata[${k}]` });
    out[k] = value;
  }
  return out;
}

function onlyKnown(params: FormParams, allowed: readonly string[]): void {
  for (const key of Object.keys(params)) {
    if (!allowed.includes(key)) {
      throw invalid(`Received unknown parameter: ${key}`, { code: 'parameter_unknown', param: key });
    }
  }
}

function oneOf<T extends string>(params: FormParams, name: string, values: readonly T[]): T | null {
  const v = str(params, name);
  if (v === undefined || v === '') return null;
  if (!(values as readonly string[]).includes(v)) {
    throw invalid(`Invalid ${name}: must be one of ${values.join(', ')}`, {
      code: 'parameter_invalid_string',
      param: name,
    });
  }
  return v as T;
}

/* ------------------------------------------------------------------ auth */

type Caller = { kind: 'secret' | 'publishable'; key: string };

function bearer(req: IncomingMessage, params: FormParams): string | null {
  const header = req.headers.authorization;
  if (header) {
    const m = /^Bearer\s+(\S+)$/i.exec(header);
    if (m) return m[1];
    const b = /^Basic\s+(\S+)$/i.exec(header);
    if (b) return Buffer.from(b[1], 'base64').toString('utf8').split(':')[0];
    return header;
  }
  // stripe.js in a browser may send the publishable key as a parameter instead.
  return typeof params.key === 'string' ? params.key : null;
}

function authenticate(req: IncomingMessage, params: FormParams, keys: ApiKeys): Caller {
  const key = bearer(req, params);
  if (key === null || key === '') {
    throw invalid(
      "You did not provide an API key. You need to provide your API key in the Authorization header, using Bearer auth (e.g. 'Authorization: Bearer YOUR_SECRET_KEY').",
      {},
      401,
    );
  }
  if (key === keys.secret) return { kind: 'secret', key };
  if (key === keys.publishable) return { kind: 'publishable', key };
  const shown =
    key.length > 8 ? `${key.slice(0, key.indexOf('_', 3) + 1)}${'*'.repeat(4)}${key.slice(-4)}` : key;
  throw invalid(`Invalid API Key provided: ${shown}`, { code: 'api_key_invalid' }, 401);
}

function needSecret(caller: Caller): void {
  if (caller.kind !== 'secret') {
    throw invalid(
      'This API call cannot be made with a publishable API key. Please use a secret API key.',
      { code: 'secret_key_required' },
      401,
    );
  }
}

/** With the publishable key, a payment intent is reachable only with its client secret. */
function checkClientSecret(caller: Caller, pi: Stripe.PaymentIntent, params: FormParams): void {
  const given = str(params, 'client_secret');
  if (caller.kind === 'secret' && given === undefined) return;
  if (given === undefined) {
    throw invalid('Missing required param: client_secret.', {
      code: 'parameter_missing',
      param: 'client_secret',
    });
  }
  if (given !== pi.client_secret) {
    throw invalid(
      'The client_secret provided does not match the client_secret associated with the PaymentIntent.',
      { code: 'payment_intent_invalid_parameter', param: 'client_secret' },
    );
  }
}

/* ------------------------------------------------------------------ routes */

interface Answer {
  status: number;
  body: unknown;
}

const CREATE_PARAMS = [
  'amount',
  'currency',
  'metadata',
  'description',
  'payment_method_types',
  'automatic_payment_methods',
  'confirm',
  'payment_method',
  'return_url',
  'receipt_email',
  'capture_method',
  'confirmation_method',
  'statement_descriptor_suffix',
  'expand',
] as const;

const CONFIRM_PARAMS = [
  'payment_method',
  'payment_method_data',
  'return_url',
  'receipt_email',
  'use_stripe_sdk',
  'expand',
  'client_secret',
  'key',
] as const;

function expandOf(params: FormParams): string[] {
  return stringArray(params, 'expand') ?? [];
}

function createIntent(ctx: ApiContext, params: FormParams, cause: Cause): Answer {
  onlyKnown(params, CREATE_PARAMS);
  const amount = int(params, 'amount');
  if (amount === undefined)
    throw invalid('Missing required param: amount.', { code: 'parameter_missing', param: 'amount' });
  if (amount < 1) {
    throw invalid('Amount must be at least 1 in the smallest currency unit.', {
      code: 'amount_too_small',
      param: 'amount',
    });
  }
  if (amount > 99_999_999) {
    throw invalid('Amount must be no more than 99999999.', { code: 'amount_too_large', param: 'amount' });
  }
  const currency = required(params, 'currency');
  if (!CURRENCY.test(currency)) {
    throw invalid(`Invalid currency: ${currency}. Use a lower-case three-letter ISO code.`, {
      code: 'parameter_invalid_string',
      param: 'currency',
    });
  }
  const types = stringArray(params, 'payment_method_types');
  const apm = params.automatic_payment_methods;
  let automatic = false;
  if (apm !== undefined) {
    if (
      typeof apm !== 'object' ||
      Array.isArray(apm) ||
      (apm.enabled !== 'true' && apm.enabled !== 'false')
    ) {
      throw invalid('Invalid automatic_payment_methods[enabled]: must be true or false', {
        param: 'automatic_payment_methods[enabled]',
      });
    }
    automatic = apm.enabled === 'true';
  }
  if (types && automatic) {
    throw invalid(
      'You may only specify one of these parameters: automatic_payment_methods, payment_method_types.',
    );
  }
  if (types && types.some((t) => t !== 'card')) {
    throw invalid('The local payments fake supports only payment_method_types[]=card.', {
      code: 'payment_intent_invalid_parameter',
      param: 'payment_method_types',
    });
  }
  // Only automatic capture and confirmation exist here; other values are refused, not ignored.
  oneOf(params, 'capture_method', ['automatic', 'automatic_async'] as const);
  oneOf(params, 'confirmation_method', ['automatic'] as const);
  const paymentMethod = str(params, 'payment_method');
  if (paymentMethod && !ctx.store.knowsPaymentMethod(paymentMethod)) {
    throw invalid(`No such PaymentMethod: '${paymentMethod}'`, {
      code: 'resource_missing',
      param: 'payment_method',
    });
  }
  const confirm = bool(params, 'confirm') ?? false;
  if (confirm && !paymentMethod) {
    throw invalid('A payment_method is required to confirm a PaymentIntent on creation.', {
      code: 'parameter_missing',
      param: 'payment_method',
    });
  }
  const pi = ctx.store.createIntent(
    {
      paymentMethod: paymentMethod ?? null,
      amount,
      currency,
      description: str(params, 'description') || null,
      metadata: metadata(params) ?? {},
      paymentMethodTypes: types ?? ['card'],
      automatic,
      receiptEmail: str(params, 'receipt_email') || null,
    },
    cause,
  );
  if (confirm) ctx.store.confirm(pi.id, { paymentMethod, returnUrl: str(params, 'return_url') }, cause);
  return { status: 200, body: ctx.store.view(pi, expandOf(params)) };
}

function confirmIntent(
  ctx: ApiContext,
  id: string,
  caller: Caller,
  params: FormParams,
  cause: Cause,
): Answer {
  onlyKnown(params, CONFIRM_PARAMS);
  const pi = ctx.store.intent(id);
  checkClientSecret(caller, pi, params);
  const data = params.payment_method_data;
  let card: { number: string; exp_month: string; exp_year: string; cvc: string } | undefined;
  if (data !== undefined) {
    const c = typeof data === 'object' && !Array.isArray(data) ? data.card : undefined;
    if (
      typeof data !== 'object' ||
      Array.isArray(data) ||
      data.type !== 'card' ||
      typeof c !== 'object' ||
      Array.isArray(c)
    ) {
      throw invalid('payment_method_data needs type=card and card details.', {
        param: 'payment_method_data',
      });
    }
    const field = (k: string): string => (typeof c[k] === 'string' ? c[k] : '');
    card = {
      number: field('number'),
      exp_month: field('exp_month'),
      exp_year: field('exp_year'),
      cvc: field('cvc'),
    };
  }
  const paymentMethod = str(params, 'payment_method');
  if (card && paymentMethod) {
    throw invalid('You may only specify one of these parameters: payment_method, payment_method_data.');
  }
  ctx.store.confirm(id, { paymentMethod, card, returnUrl: str(params, 'return_url') }, cause);
  return { status: 200, body: ctx.store.view(pi, expandOf(params)) };
}

function createRefund(ctx: ApiContext, params: FormParams, cause: Cause): Answer {
  onlyKnown(params, ['payment_intent', 'charge', 'amount', 'reason', 'metadata', 'expand']);
  const amount = int(params, 'amount');
  if (amount !== undefined && amount < 1) {
    throw invalid('Refund amount must be at least 1.', {
      code: 'parameter_invalid_integer',
      param: 'amount',
    });
  }
  const refund = ctx.store.createRefund(
    {
      paymentIntent: str(params, 'payment_intent'),
      charge: str(params, 'charge'),
      amount,
      reason: oneOf(params, 'reason', REFUND_REASONS),
      metadata: metadata(params) ?? {},
    },
    cause,
  );
  return { status: 200, body: refund };
}

function list<T>(url: string, data: T[], params: FormParams): Stripe.ApiList<T> {
  const limit = int(params, 'limit') ?? 10;
  if (limit < 1 || limit > 100) throw invalid('limit must be between 1 and 100', { param: 'limit' });
  return { object: 'list', data: data.slice(0, limit), has_more: data.length > limit, url };
}

function route(
  ctx: ApiContext,
  method: string,
  path: string,
  caller: Caller,
  params: FormParams,
  cause: Cause,
): Answer {
  const { store } = ctx;
  const parts = path.split('/').filter(Boolean); // ['v1', 'payment_intents', id, action]
  const [, resource, id, action] = parts;
  if (resource === 'payment_intents') {
    if (method === 'POST' && parts.length === 2) {
      needSecret(caller);
      return createIntent(ctx, params, cause);
    }
    if (method === 'GET' && parts.length === 3) {
      onlyKnown(params, ['client_secret', 'expand', 'key']);
      const pi = store.intent(id);
      checkClientSecret(caller, pi, params);
      return { status: 200, body: store.view(pi, expandOf(params)) };
    }
    if (method === 'POST' && parts.length === 3) {
      needSecret(caller);
      onlyKnown(params, ['amount', 'description', 'metadata', 'expand']);
      const amount = int(params, 'amount');
      if (amount !== undefined && amount < 1)
        throw invalid('Amount must be at least 1.', { param: 'amount' });
      const description = str(params, 'description');
      const pi = store.updateIntent(id, {
        amount,
        description: description === undefined ? undefined : description || null,
        metadata: metadata(params),
      });
      return { status: 200, body: store.view(pi, expandOf(params)) };
    }
    if (method === 'POST' && parts.length === 4 && action === 'confirm') {
      return confirmIntent(ctx, id, caller, params, cause);
    }
    if (method === 'POST' && parts.length === 4 && action === 'cancel') {
      needSecret(caller);
      onlyKnown(params, ['cancellation_reason', 'expand']);
      const pi = store.cancel(id, oneOf(params, 'cancellation_reason', CANCELLATION_REASONS), cause);
      return { status: 200, body: store.view(pi, expandOf(params)) };
    }
  }
  if (resource === 'refunds') {
    needSecret(caller);
    if (method === 'POST' && parts.length === 2) return createRefund(ctx, params, cause);
    if (method === 'GET' && parts.length === 3) return { status: 200, body: store.refund(id) };
    if (method === 'GET' && parts.length === 2) {
      onlyKnown(params, ['payment_intent', 'charge', 'limit']);
      const data = store.listRefunds({
        paymentIntent: str(params, 'payment_intent'),
        charge: str(params, 'charge'),
      });
      return { status: 200, body: list('/v1/refunds', data, params) };
    }
  }
  if (resource === 'charges' && method === 'GET' && parts.length === 3) {
    needSecret(caller);
    const charge = store.charges.get(id);
    if (!charge) throw invalid(`No such charge: '${id}'`, { code: 'resource_missing', param: 'id' }, 404);
    return { status: 200, body: charge };
  }
  if (resource === 'events' && method === 'GET') {
    needSecret(caller);
    if (parts.length === 3) {
      const stored = store.event(id);
      if (!stored) throw invalid(`No such event: '${id}'`, { code: 'resource_missing', param: 'id' }, 404);
      return { status: 200, body: stored.event };
    }
    if (parts.length === 2) {
      const type = str(params, 'type');
      const data = store.events
        .map((e) => e.event)
        .filter((e) => !type || e.type === type)
        .reverse();
      return { status: 200, body: list('/v1/events', data, { limit: params.limit ?? '10' }) };
    }
  }
  throw invalid(`Unrecognized request URL (${method}: ${path}).`, {}, 404);
}

function send(res: ServerResponse, status: number, body: string, headers: Record<string, string>): void {
  res.writeHead(status, {
    ...CORS_HEADERS,
    'content-type': 'application/json',
    'cache-control': 'no-cache, no-store',
    ...headers,
  });
  res.end(body);
}

/** Answers one `/v1/…` request (the caller routed it here). */
export async function handleApi(
  ctx: ApiContext,
  req: IncomingMessage,
  res: ServerResponse,
  url: URL,
): Promise<void> {
  const method = req.method ?? 'GET';
  const requestId = newId('req', 14);
  const version =
    typeof req.headers['stripe-version'] === 'string' ? req.headers['stripe-version'] : API_VERSION;
  const baseHeaders = { 'request-id': requestId, 'stripe-version': version };
  if (method === 'OPTIONS') {
    res.writeHead(204, CORS_HEADERS);
    res.end();
    return;
  }
  let status: number;
  let body: unknown;
  let replayKey: string | null = null;
  let params: FormParams = {};
  try {
    const raw = method === 'POST' ? await readBody(req) : url.search.slice(1);
    try {
      params = parseForm(raw);
    } catch (err) {
      if (err instanceof FormError) throw invalid(err.message);
      throw err;
    }
    const caller = authenticate(req, params, ctx.keys);
    const idempotencyKey =
      method === 'POST' ? ((req.headers['idempotency-key'] as string | undefined) ?? null) : null;
    if (idempotencyKey) {
      replayKey = `${caller.key} ${idempotencyKey}`;
      const seen = ctx.idempotency.get(replayKey);
      if (seen) {
        if (
          seen.method === method &&
          seen.path === url.pathname &&
          seen.fingerprint === fingerprint(params)
        ) {
          send(res, seen.status, seen.body, {
            ...baseHeaders,
            'request-id': seen.requestId,
            'idempotent-replayed': 'true',
          });
          return;
        }
        replayKey = null;
        throw new ApiError(400, {
          type: 'idempotency_error',
          message: `Keys for idempotent requests can only be used with the same parameters they were first used with. Try using a key other than '${idempotencyKey}' if you meant to execute a different request.`,
        });
      }
    }
    const answer = route(ctx, method, url.pathname, caller, params, { requestId, idempotencyKey });
    status = answer.status;
    body = answer.body;
  } catch (err) {
    if (err instanceof ApiError) {
      status = err.status;
      body = { error: { ...err.body, request_log_url: undefined } };
    } else {
      status = 500;
      body = {
        error: {
          type: 'api_error',
          message: `The payments fake failed: ${err instanceof Error ? err.message : String(err)}`,
        },
      };
      replayKey = null;
    }
  }
  const text = JSON.stringify(body, null, 2);
  if (replayKey && status !== 401) {
    ctx.idempotency.set(replayKey, {
      method,
      path: url.pathname,
      fingerprint: fingerprint(params),
      status,
      body: text,
      requestId,
    });
  }
  send(res, status, text, baseHeaders);
}
