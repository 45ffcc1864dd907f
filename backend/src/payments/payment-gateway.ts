import { Injectable, Logger } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';
import Stripe from 'stripe';
import type { PaymentsConfig } from '../config/app.config';
import { UnavailableError } from '../common/errors/domain-errors';

/** Every call Loamline makes to the hosted payment service, through its own SDK. */
export type PaymentIntent = Stripe.PaymentIntent;
export type PaymentEvent = Stripe.Event;

/** The service answered that it cannot do it (not a network fault): retrying will not help. */
export function isRefusal(e: unknown): e is Stripe.errors.StripeError {
  return (
    e instanceof Stripe.errors.StripeInvalidRequestError ||
    e instanceof Stripe.errors.StripeCardError ||
    e instanceof Stripe.errors.StripeIdempotencyError
  );
}

/** The service's error code (`payment_intent_unexpected_state`, `charge_already_refunded`, …). */
export function errorCode(e: unknown): string | undefined {
  return e instanceof Stripe.errors.StripeError ? e.code : undefined;
}

/**
 * The payment service, through the real `stripe` SDK. Locally it talks to the payment fake
 * (`PAYMENTS_HOST`/`PAYMENTS_PORT`/`PAYMENTS_PROTOCOL`); the code is the same against the hosted
 * service. Every POST carries an idempotency key derived from our own row, so a retry (a timeout, a
 * second app instance, a restart) never charges, cancels or refunds twice.
 */
@Injectable()
export class PaymentGateway {
  private readonly logger = new Logger(PaymentGateway.name);
  private readonly stripe: Stripe;
  readonly publishableKey: string;
  readonly scriptUrl: string | null;
  private readonly webhookSecret: string;

  constructor(config: ConfigService) {
    const c = config.getOrThrow<PaymentsConfig>('payments');
    this.stripe = new Stripe(c.secretKey, {
      host: c.host,
      port: c.port,
      protocol: c.protocol,
      timeout: c.timeoutMs,
      maxNetworkRetries: 1,
      appInfo: { name: 'Loamline' },
    });
    this.publishableKey = c.publishableKey;
    this.scriptUrl = c.scriptUrl;
    this.webhookSecret = c.webhookSecret;
  }

  /** The intent for a held appointment; 503 when the service cannot be reached. */
  async createIntent(p: {
    appointmentId: string;
    amountMinor: number;
    currency: string;
    description: string;
    shopId: string;
    riderId: string;
  }): Promise<PaymentIntent> {
    return this.reachable(
      "Online payment isn't available right now, so nothing was booked. Try again in a few minutes, or call the shop.",
      () =>
        this.stripe.paymentIntents.create(
          {
            amount: p.amountMinor,
            currency: p.currency.toLowerCase(),
            description: p.description,
            automatic_payment_methods: { enabled: true, allow_redirects: 'never' },
            metadata: { appointmentId: p.appointmentId, shopId: p.shopId, riderId: p.riderId },
          },
          { idempotencyKey: `loamline-appointment-${p.appointmentId}-intent` },
        ),
    );
  }

  /** The intent as the service has it now, with its charge (for the card's brand and last digits). */
  retrieve(intentId: string): Promise<PaymentIntent> {
    return this.reachable("The payment service can't be reached right now. Try again in a minute.", () =>
      this.stripe.paymentIntents.retrieve(intentId, { expand: ['latest_charge'] }),
    );
  }

  cancel(intentId: string, key: string): Promise<PaymentIntent> {
    return this.stripe.paymentIntents.cancel(
      intentId,
      { cancellation_reason: 'abandoned' },
      { idempotencyKey: `loamline-intent-${key}-cancel` },
    );
  }

  refund(p: {
    refundId: string;
    intentId: string;
    amountMinor: number;
    appointmentId: string;
    kind: string;
  }): Promise<Stripe.Refund> {
    return this.stripe.refunds.create(
      {
        payment_intent: p.intentId,
        amount: p.amountMinor,
        reason: 'requested_by_customer',
        metadata: { refundId: p.refundId, appointmentId: p.appointmentId, kind: p.kind },
      },
      { idempotencyKey: `loamline-refund-${p.refundId}` },
    );
  }

  /** Checks the `Stripe-Signature` over the raw body with the endpoint secret (throws if forged or stale). */
  verifyEvent(rawBody: Buffer, signature: string): PaymentEvent {
    return this.stripe.webhooks.constructEvent(rawBody, signature, this.webhookSecret);
  }

  private async reachable<T>(message: string, call: () => Promise<T>): Promise<T> {
    try {
      return await call();
    } catch (e) {
      if (
        e instanceof Stripe.errors.StripeConnectionError ||
        e instanceof Stripe.errors.StripeAPIError ||
        e instanceof Stripe.errors.StripeRateLimitError
      ) {
        this.logger.warn(`payment service unreachable: ${e.message}`);
        throw new UnavailableError(message);
      }
      throw e;
    }
  }
}
