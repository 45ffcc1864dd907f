import type { INestApplicationContext } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';
import Stripe from 'stripe';
import { DataSource } from 'typeorm';
import type { AppointmentEntity } from '../../appointments/appointment.entity';
import type { PaymentsConfig } from '../../config/app.config';
import { PaymentRefundEntity } from '../../payments/payment-refund.entity';
import { PaymentEntity } from '../../payments/payment.entity';

/**
 * The demo's money, made at the payment service (locally the payment fake) exactly as riders and
 * shops would have made it, so that receipts, Workshop → Payments and refunds by hand work on the
 * demo data: a paid appointment's intent confirmed with the documented success test token, a
 * declined or cancelled one refunded in full (the demo cancellation was in good time), an expired
 * hold's intent cancelled, a held one left to pay. The same idempotency keys as the app's.
 */
export class DemoPayments {
  private readonly stripe: Stripe;
  private readonly db: DataSource;

  constructor(app: INestApplicationContext) {
    const c = app.get(ConfigService).getOrThrow<PaymentsConfig>('payments');
    this.stripe = new Stripe(c.secretKey, {
      host: c.host,
      port: c.port,
      protocol: c.protocol,
      timeout: c.timeoutMs,
      maxNetworkRetries: 1,
    });
    this.db = app.get(DataSource);
  }

  /** True when the payment service answers (the seed writes no money without it). */
  async reachable(): Promise<boolean> {
    try {
      await this.stripe.paymentIntents.retrieve('pi_reachability_check');
      return true;
    } catch (e) {
      return !(e instanceof Stripe.errors.StripeConnectionError);
    }
  }

  async seed(a: AppointmentEntity, description: string): Promise<void> {
    if (a.depositMinor === 0) return;
    const kind = a.depositMinor >= a.priceMinor ? 'full' : 'deposit';
    // paid when booked: a few days before the appointment, never in the future
    const paidAt = new Date(Math.min(Date.now(), a.startAt.getTime() - 4 * 86_400_000));
    const refundedAt = new Date(Math.min(Date.now(), paidAt.getTime() + 2 * 86_400_000));
    let intent = await this.stripe.paymentIntents.create(
      {
        amount: a.depositMinor,
        currency: a.currency.toLowerCase(),
        description,
        automatic_payment_methods: { enabled: true, allow_redirects: 'never' },
        metadata: { appointmentId: a.id, shopId: a.shopId, riderId: a.riderId },
      },
      { idempotencyKey: `loamline-appointment-${a.id}-intent` },
    );
    const row = this.db.getRepository(PaymentEntity).create({
      appointmentId: a.id,
      shopId: a.shopId,
      intentId: intent.id,
      kind,
      amountMinor: a.depositMinor,
      currency: a.currency,
      status: 'requires_payment_method',
      createdAt: paidAt,
    });
    if (a.status === 'held') {
      await this.db.getRepository(PaymentEntity).insert({ ...row, createdAt: new Date() });
      return;
    }
    if (a.status === 'expired') {
      await this.stripe.paymentIntents.cancel(
        intent.id,
        {},
        { idempotencyKey: `loamline-intent-${a.id}-cancel` },
      );
      await this.db.getRepository(PaymentEntity).insert({ ...row, status: 'canceled' });
      return;
    }
    intent = await this.stripe.paymentIntents.confirm(intent.id, {
      payment_method: 'pm_card_visa',
      expand: ['latest_charge'],
    });
    const card =
      typeof intent.latest_charge === 'object' ? intent.latest_charge?.payment_method_details?.card : null;
    Object.assign(row, {
      status: 'succeeded',
      paidMinor: intent.amount_received,
      paidAt,
      cardBrand: card?.brand ?? null,
      cardLast4: card?.last4 ?? null,
    });
    await this.db.getRepository(PaymentEntity).insert(row); // sets row.id
    if (a.status !== 'declined' && a.status !== 'cancelled') return;
    const refund = this.db.getRepository(PaymentRefundEntity).create({
      paymentId: row.id,
      requestKey: `${a.status === 'declined' ? 'decline' : 'cancel'}:${a.id}`,
      amountMinor: intent.amount_received,
      kind: a.status === 'declined' ? 'decline' : 'rider-cancel',
      reason:
        a.status === 'declined'
          ? 'The shop declined the booking.'
          : 'Cancelled by the rider more than the cancellation window ahead.',
      actorId: a.status === 'declined' ? null : a.riderId,
      actorSide: a.status === 'declined' ? 'staff' : 'rider',
      status: 'pending',
      nextAttemptAt: new Date(Date.now() + 3_600_000), // the seed makes it itself, just below
      createdAt: refundedAt,
    });
    await this.db.getRepository(PaymentRefundEntity).insert(refund);
    const made = await this.stripe.refunds.create(
      { payment_intent: intent.id, amount: refund.amountMinor, reason: 'requested_by_customer' },
      { idempotencyKey: `loamline-refund-${refund.id}` },
    );
    await this.db
      .getRepository(PaymentRefundEntity)
      .update(
        { id: refund.id },
        { status: 'succeeded', refundRef: made.id, attempts: 1, doneAt: new Date() },
      );
  }
}
