import { randomBytes } from 'node:crypto';
import type Stripe from 'stripe';
import { type CardDetails, cardForToken, cardFromData } from './cards';

/**
 * The fake's state, in memory: payment intents, their charges, refunds, the card payment methods
 * confirmed with, and the events every state change makes. The rules follow the hosted service's
 * documented behaviour for card payments with automatic capture (the only kind the app makes).
 */

/** The API version the installed SDK pins (`stripe/cjs/apiVersion.js`); events carry it. */
export const API_VERSION = '2026-10-28.endive';

export type ErrorType = 'invalid_request_error' | 'card_error' | 'idempotency_error' | 'api_error';

/** The service's error body: `{ error: ApiErrorBody }`. */
export interface ApiErrorBody {
  type: ErrorType;
  message: string;
  code?: string;
  decline_code?: string;
  param?: string;
  doc_url?: string;
  charge?: string;
  payment_intent?: Stripe.PaymentIntent;
}

export class ApiError extends Error {
  constructor(
    readonly status: number,
    readonly body: ApiErrorBody,
  ) {
    super(body.message);
  }
}

export function invalid(message: string, extra: Partial<ApiErrorBody> = {}, status = 400): ApiError {
  return new ApiError(status, { type: 'invalid_request_error', message, ...extra });
}

/** What caused a change: the API request (its id and idempotency key), or the fake itself. */
export interface Cause {
  requestId: string | null;
  idempotencyKey: string | null;
}

export const NO_REQUEST: Cause = { requestId: null, idempotencyKey: null };

export interface Delivery {
  attempt: number;
  /** ISO time the attempt started. */
  at: string;
  /** The app's HTTP status, or null when the request failed (connection refused, timeout). */
  status: number | null;
  error?: string;
  ms: number;
  /** True for a `/_fake/events/:id/redeliver`. */
  manual: boolean;
}

export type DeliveryState = 'stored' | 'pending' | 'delivered' | 'failed';

export interface StoredEvent {
  event: Stripe.Event;
  /** `stored`: no webhook URL; `pending`: not answered with 2xx yet; `failed`: given up. */
  state: DeliveryState;
  deliveries: Delivery[];
  /** Epoch ms of the next automatic attempt, null when none is due. */
  nextAttemptAt: number | null;
}

export type EventType =
  | 'payment_intent.created'
  | 'payment_intent.succeeded'
  | 'payment_intent.payment_failed'
  | 'payment_intent.requires_action'
  | 'payment_intent.canceled'
  | 'charge.succeeded'
  | 'charge.failed'
  | 'charge.refunded'
  | 'refund.created';

const ALPHABET = 'ABCDEFGHIJKLMNOPQRSTUVWXYZabcdefghijklmnopqrstuvwxyz0123456789';

export function newId(prefix: string, length = 24): string {
  const bytes = randomBytes(length);
  let out = '';
  for (const b of bytes) out += ALPHABET[b % ALPHABET.length];
  return `${prefix}_${out}`;
}

const clone = <T>(value: T): T => structuredClone(value);

export interface ConfirmInput {
  /** A test token (`pm_card_visa` …) or a `pm_…` the fake made before. */
  paymentMethod?: string;
  /** Raw card data from the browser (`payment_method_data[card]`). */
  card?: { number: string; exp_month: string; exp_year: string; cvc: string };
  returnUrl?: string;
}

export interface CreateInput {
  amount: number;
  currency: string;
  description: string | null;
  metadata: Record<string, string>;
  paymentMethodTypes: string[];
  automatic: boolean;
  receiptEmail: string | null;
  /** Given without confirm=true: the intent waits in `requires_confirmation`. */
  paymentMethod: string | null;
}

export interface RefundInput {
  paymentIntent?: string;
  charge?: string;
  amount?: number;
  reason: Stripe.Refund.Reason | null;
  metadata: Record<string, string>;
}

const DECLINES = {
  decline: { decline_code: 'generic_decline', message: 'Your card was declined.' },
  insufficient_funds: { decline_code: 'insufficient_funds', message: 'Your card has insufficient funds.' },
} as const;

const AUTH_FAILURE_MESSAGE =
  'The provided PaymentMethod has failed authentication. You can provide payment_method_data or a new PaymentMethod to attempt to fulfill this PaymentIntent again.';

export interface StoreOptions {
  /** Where the fake is reached from a browser; authentication URLs start with it. */
  publicUrl: string;
  /** How many endpoints each new event goes to (1 with a webhook URL, else 0). */
  pendingWebhooks: () => number;
  /** Called with each new event (the webhook sender queues it). */
  onEvent?: (stored: StoredEvent) => void;
}

export class PaymentStore {
  readonly intents = new Map<string, Stripe.PaymentIntent>();
  readonly charges = new Map<string, Stripe.Charge>();
  readonly refunds = new Map<string, Stripe.Refund>();
  readonly paymentMethods = new Map<string, CardDetails>();
  readonly events: StoredEvent[] = [];

  constructor(private readonly options: StoreOptions) {}

  reset(): void {
    this.intents.clear();
    this.charges.clear();
    this.refunds.clear();
    this.paymentMethods.clear();
    this.events.length = 0;
  }

  private now(): number {
    return Math.floor(Date.now() / 1000);
  }

  /* ------------------------------------------------------------------ events */

  private emit(
    type: EventType,
    object: Stripe.PaymentIntent | Stripe.Charge | Stripe.Refund,
    cause: Cause,
  ): void {
    const event = {
      id: newId('evt'),
      object: 'event',
      api_version: API_VERSION,
      created: this.now(),
      data: { object: clone(object) },
      livemode: false,
      pending_webhooks: this.options.pendingWebhooks(),
      request: { id: cause.requestId, idempotency_key: cause.idempotencyKey },
      type,
    } as Stripe.Event;
    const stored: StoredEvent = {
      event,
      state: event.pending_webhooks > 0 ? 'pending' : 'stored',
      deliveries: [],
      nextAttemptAt: event.pending_webhooks > 0 ? Date.now() : null,
    };
    this.events.push(stored);
    this.options.onEvent?.(stored);
  }

  event(id: string): StoredEvent | undefined {
    return this.events.find((e) => e.event.id === id);
  }

  /* ------------------------------------------------------------------ payment intents */

  intent(id: string): Stripe.PaymentIntent {
    const pi = this.intents.get(id);
    if (!pi) {
      throw invalid(`No such payment_intent: '${id}'`, { code: 'resource_missing', param: 'intent' }, 404);
    }
    return pi;
  }

  /** The intent as answered: a copy, `latest_charge` expanded on request. */
  view(pi: Stripe.PaymentIntent, expand: string[] = []): Stripe.PaymentIntent {
    const out = clone(pi);
    if (expand.includes('latest_charge') && typeof out.latest_charge === 'string') {
      out.latest_charge = clone(this.charges.get(out.latest_charge) ?? null);
    }
    return out;
  }

  createIntent(input: CreateInput, cause: Cause): Stripe.PaymentIntent {
    const id = newId('pi');
    const pi: Stripe.PaymentIntent = {
      id,
      object: 'payment_intent',
      allowed_payment_method_types: null,
      amount: input.amount,
      amount_capturable: 0,
      amount_details: { tip: {} },
      amount_received: 0,
      application: null,
      application_fee_amount: null,
      automatic_payment_methods: input.automatic ? { allow_redirects: 'always', enabled: true } : null,
      canceled_at: null,
      cancellation_reason: null,
      capture_method: 'automatic',
      client_secret: `${id}_secret_${newId('x', 25).slice(2)}`,
      confirmation_method: 'automatic',
      created: this.now(),
      currency: input.currency,
      customer: null,
      customer_account: null,
      description: input.description,
      excluded_payment_method_types: null,
      last_payment_error: null,
      latest_charge: null,
      livemode: false,
      managed_payments: null,
      metadata: input.metadata,
      next_action: null,
      on_behalf_of: null,
      payment_method: input.paymentMethod,
      payment_method_configuration_details: null,
      payment_method_options: {
        card: {
          installments: null,
          mandate_options: null,
          network: null,
          request_three_d_secure: 'automatic',
        },
      },
      payment_method_types: input.paymentMethodTypes,
      payment_record: null,
      processing: null,
      receipt_email: input.receiptEmail,
      review: null,
      setup_future_usage: null,
      shipping: null,
      source: null,
      statement_descriptor: null,
      statement_descriptor_suffix: null,
      status: input.paymentMethod ? 'requires_confirmation' : 'requires_payment_method',
      transfer_data: null,
      transfer_group: null,
    };
    this.intents.set(id, pi);
    this.emit('payment_intent.created', pi, cause);
    return pi;
  }

  updateIntent(
    id: string,
    input: { amount?: number; description?: string | null; metadata?: Record<string, string> },
  ): Stripe.PaymentIntent {
    const pi = this.intent(id);
    if (input.amount !== undefined) {
      if (!['requires_payment_method', 'requires_confirmation', 'requires_action'].includes(pi.status)) {
        throw unexpectedState(pi, 'update the amount of');
      }
      pi.amount = input.amount;
    }
    if (input.description !== undefined) pi.description = input.description;
    if (input.metadata) {
      for (const [k, v] of Object.entries(input.metadata)) {
        if (v === '') delete pi.metadata[k];
        else pi.metadata[k] = v;
      }
    }
    return pi;
  }

  /** A test token or a `pm_…` the fake made. */
  knowsPaymentMethod(id: string): boolean {
    return this.paymentMethods.has(id) || cardForToken(id) !== null;
  }

  private resolveCard(input: ConfirmInput): { pmId: string; card: CardDetails } {
    if (input.card) {
      const card = cardFromData(input.card.number, input.card.exp_month, input.card.exp_year, input.card.cvc);
      if ('code' in card) {
        throw new ApiError(402, {
          type: 'card_error',
          code: card.code,
          message: card.message,
          param: `payment_method_data[card][${card.param}]`,
        });
      }
      const pmId = newId('pm');
      this.paymentMethods.set(pmId, card);
      return { pmId, card };
    }
    const token = input.paymentMethod ?? '';
    const known = this.paymentMethods.get(token);
    if (known) return { pmId: token, card: known };
    const card = cardForToken(token);
    if (!card) {
      throw invalid(`No such PaymentMethod: '${token}'`, {
        code: 'resource_missing',
        param: 'payment_method',
      });
    }
    const pmId = newId('pm');
    this.paymentMethods.set(pmId, card);
    return { pmId, card };
  }

  confirm(id: string, input: ConfirmInput, cause: Cause): Stripe.PaymentIntent {
    const pi = this.intent(id);
    if (!['requires_payment_method', 'requires_confirmation', 'requires_action'].includes(pi.status)) {
      throw unexpectedState(pi, 'confirm');
    }
    if (!input.card && !input.paymentMethod) {
      if (typeof pi.payment_method === 'string' && pi.status === 'requires_confirmation') {
        input = { ...input, paymentMethod: pi.payment_method };
      } else {
        throw invalid(
          'You cannot confirm this PaymentIntent because it’s missing a payment method. To confirm the PaymentIntent with a payment method, you must provide a `payment_method` or `payment_method_data`.',
          { code: 'payment_intent_unexpected_state', payment_intent: this.view(pi) },
        );
      }
    }
    const { pmId, card } = this.resolveCard(input);
    pi.next_action = null;
    pi.last_payment_error = null;
    if (card.outcome === 'decline' || card.outcome === 'insufficient_funds') {
      const decline = DECLINES[card.outcome];
      const charge = this.makeCharge(pi, pmId, card, {
        code: 'card_declined',
        message: decline.message,
        reason: decline.decline_code,
      });
      pi.latest_charge = charge.id;
      pi.payment_method = null;
      pi.status = 'requires_payment_method';
      pi.last_payment_error = {
        type: 'card_error',
        charge: charge.id,
        code: 'card_declined',
        decline_code: decline.decline_code,
        message: decline.message,
        payment_method_type: 'card',
      };
      this.emit('charge.failed', charge, cause);
      this.emit('payment_intent.payment_failed', pi, cause);
      throw new ApiError(402, {
        type: 'card_error',
        code: 'card_declined',
        decline_code: decline.decline_code,
        message: decline.message,
        charge: charge.id,
        payment_intent: this.view(pi),
      });
    }
    pi.payment_method = pmId;
    if (card.outcome === 'authenticate') {
      const secret = encodeURIComponent(pi.client_secret ?? '');
      pi.status = 'requires_action';
      pi.next_action = {
        type: 'redirect_to_url',
        redirect_to_url: {
          url: `${this.options.publicUrl}/authenticate/${pi.id}?client_secret=${secret}`,
          return_url: input.returnUrl ?? null,
        },
      };
      this.emit('payment_intent.requires_action', pi, cause);
      return pi;
    }
    this.succeed(pi, pmId, card, cause);
    return pi;
  }

  private succeed(pi: Stripe.PaymentIntent, pmId: string, card: CardDetails, cause: Cause): void {
    const charge = this.makeCharge(pi, pmId, card, null);
    pi.status = 'succeeded';
    pi.amount_received = pi.amount;
    pi.latest_charge = charge.id;
    pi.payment_method = pmId;
    pi.next_action = null;
    pi.last_payment_error = null;
    this.emit('charge.succeeded', charge, cause);
    this.emit('payment_intent.succeeded', pi, cause);
  }

  /** The outcome of the test authentication page: `complete` pays, `fail` asks for another card. */
  authenticate(id: string, outcome: 'complete' | 'fail', cause: Cause = NO_REQUEST): Stripe.PaymentIntent {
    const pi = this.intent(id);
    if (pi.status !== 'requires_action' || typeof pi.payment_method !== 'string') {
      throw unexpectedState(pi, 'authenticate');
    }
    const card = this.paymentMethods.get(pi.payment_method);
    if (outcome === 'complete' && card) {
      this.succeed(pi, pi.payment_method, card, cause);
      return pi;
    }
    pi.status = 'requires_payment_method';
    pi.payment_method = null;
    pi.next_action = null;
    pi.last_payment_error = {
      type: 'invalid_request_error',
      code: 'payment_intent_authentication_failure',
      message: AUTH_FAILURE_MESSAGE,
      payment_method_type: 'card',
    };
    this.emit('payment_intent.payment_failed', pi, cause);
    return pi;
  }

  cancel(
    id: string,
    reason: Stripe.PaymentIntent.CancellationReason | null,
    cause: Cause,
  ): Stripe.PaymentIntent {
    const pi = this.intent(id);
    if (
      !['requires_payment_method', 'requires_confirmation', 'requires_action', 'requires_capture'].includes(
        pi.status,
      )
    ) {
      throw invalid(
        `You cannot cancel this PaymentIntent because it has a status of ${pi.status}. Only a PaymentIntent with one of the following statuses may be canceled: requires_payment_method, requires_capture, requires_confirmation, requires_action, processing.`,
        { code: 'payment_intent_unexpected_state', payment_intent: this.view(pi) },
      );
    }
    pi.status = 'canceled';
    pi.canceled_at = this.now();
    pi.cancellation_reason = reason;
    pi.next_action = null;
    this.emit('payment_intent.canceled', pi, cause);
    return pi;
  }

  /* ------------------------------------------------------------------ charges and refunds */

  private makeCharge(
    pi: Stripe.PaymentIntent,
    pmId: string,
    card: CardDetails,
    failure: { code: string; message: string; reason: string } | null,
  ): Stripe.Charge {
    const id = newId('ch');
    const paid = failure === null;
    const charge: Stripe.Charge = {
      id,
      object: 'charge',
      amount: pi.amount,
      amount_captured: paid ? pi.amount : 0,
      amount_refunded: 0,
      application: null,
      application_fee: null,
      application_fee_amount: null,
      balance_transaction: paid ? newId('txn') : null,
      billing_details: { address: null, email: null, name: null, phone: null, tax_id: null },
      calculated_statement_descriptor: 'LOAMLINE TEST',
      captured: paid,
      created: this.now(),
      currency: pi.currency,
      customer: null,
      description: pi.description,
      disputed: false,
      failure_balance_transaction: null,
      failure_code: failure?.code ?? null,
      failure_message: failure?.message ?? null,
      fraud_details: {},
      livemode: false,
      metadata: clone(pi.metadata),
      on_behalf_of: null,
      outcome: {
        advice_code: null,
        network_advice_code: null,
        network_decline_code: null,
        network_status: paid ? 'approved_by_network' : 'declined_by_network',
        reason: failure?.reason ?? null,
        risk_level: 'normal',
        seller_message: paid
          ? 'Payment complete.'
          : 'The bank did not return any further details with this decline.',
        type: paid ? 'authorized' : 'issuer_declined',
      },
      paid,
      payment_intent: pi.id,
      payment_method: pmId,
      payment_method_details: {
        type: 'card',
        card: {
          amount_authorized: paid ? pi.amount : null,
          authorization_code: paid ? '123456' : null,
          brand: card.brand,
          checks: { address_line1_check: null, address_postal_code_check: null, cvc_check: 'pass' },
          country: card.country,
          electronic_commerce_indicator: null,
          exp_month: card.exp_month,
          exp_year: card.exp_year,
          funding: card.funding,
          installments: null,
          last4: card.last4,
          mandate: null,
          network: card.brand,
          network_transaction_id: null,
          regulated_status: 'unregulated',
          three_d_secure: null,
          transaction_link_id: null,
          wallet: null,
        },
      },
      receipt_email: pi.receipt_email,
      receipt_number: null,
      receipt_url: null,
      refunded: false,
      review: null,
      shipping: null,
      source: null,
      source_transfer: null,
      statement_descriptor: null,
      statement_descriptor_suffix: null,
      status: paid ? 'succeeded' : 'failed',
      transfer_data: null,
      transfer_group: null,
    };
    this.charges.set(id, charge);
    return charge;
  }

  refund(id: string): Stripe.Refund {
    const refund = this.refunds.get(id);
    if (!refund) throw invalid(`No such refund: '${id}'`, { code: 'resource_missing', param: 'id' }, 404);
    return refund;
  }

  listRefunds(filter: { paymentIntent?: string; charge?: string }): Stripe.Refund[] {
    return [...this.refunds.values()]
      .filter((r) => !filter.paymentIntent || r.payment_intent === filter.paymentIntent)
      .filter((r) => !filter.charge || r.charge === filter.charge)
      .reverse();
  }

  createRefund(input: RefundInput, cause: Cause): Stripe.Refund {
    let charge: Stripe.Charge | undefined;
    if (input.charge) {
      charge = this.charges.get(input.charge);
      if (!charge)
        throw invalid(`No such charge: '${input.charge}'`, { code: 'resource_missing', param: 'charge' });
    } else if (input.paymentIntent) {
      const pi = this.intents.get(input.paymentIntent);
      if (!pi) {
        throw invalid(`No such payment_intent: '${input.paymentIntent}'`, {
          code: 'resource_missing',
          param: 'payment_intent',
        });
      }
      if (pi.status !== 'succeeded' || typeof pi.latest_charge !== 'string') {
        throw invalid(`This PaymentIntent (${pi.id}) does not have a successful charge to refund.`, {
          code: 'charge_not_refundable',
          param: 'payment_intent',
        });
      }
      charge = this.charges.get(pi.latest_charge);
    } else {
      throw invalid(
        'One of the following params should be provided for this request: payment_intent or charge.',
        {
          code: 'parameter_missing',
        },
      );
    }
    if (!charge || !charge.paid) {
      throw invalid(`Charge ${charge?.id ?? ''} has not succeeded and cannot be refunded.`, {
        code: 'charge_not_refundable',
      });
    }
    const left = charge.amount - charge.amount_refunded;
    if (left <= 0) {
      throw invalid(`Charge ${charge.id} has already been refunded.`, { code: 'charge_already_refunded' });
    }
    const amount = input.amount ?? left;
    if (amount > left) {
      throw invalid(`Refund amount (${amount}) is greater than unrefunded amount on charge (${left}).`, {
        code: 'amount_too_large',
        param: 'amount',
      });
    }
    const refund: Stripe.Refund = {
      id: newId('re'),
      object: 'refund',
      amount,
      balance_transaction: newId('txn'),
      charge: charge.id,
      created: this.now(),
      currency: charge.currency,
      customer: null,
      customer_account: null,
      destination_details: {
        type: 'card',
        card: { reference_status: 'pending', reference_type: 'acquirer_reference_number', type: 'refund' },
      },
      metadata: input.metadata,
      payment_intent: typeof charge.payment_intent === 'string' ? charge.payment_intent : null,
      payment_method: charge.payment_method,
      reason: input.reason,
      receipt_number: null,
      source_transfer_reversal: null,
      status: 'succeeded',
      transfer_reversal: null,
    };
    this.refunds.set(refund.id, refund);
    charge.amount_refunded += amount;
    charge.refunded = charge.amount_refunded >= charge.amount;
    this.emit('refund.created', refund, cause);
    this.emit('charge.refunded', charge, cause);
    return refund;
  }
}

function unexpectedState(pi: Stripe.PaymentIntent, verb: string): ApiError {
  return invalid(`You cannot ${verb} this PaymentIntent because it has a status of ${pi.status}.`, {
    code: 'payment_intent_unexpected_state',
    payment_intent: structuredClone(pi),
  });
}
