import { Inject, Injectable, Logger, type OnModuleInit } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';
import { InjectDataSource } from '@nestjs/typeorm';
import { DateTime } from 'luxon';
import { type DataSource, type EntityManager, In } from 'typeorm';
import type Stripe from 'stripe';
import type {
  PaymentsClientConfig,
  PaymentState,
  PaymentSummary,
  RefundView,
  WorkshopPaymentRow,
} from '@loamline/shared-types';
import {
  type AppointmentChange,
  type AppointmentPayments,
  type AppointmentReceipt,
  AppointmentsService,
  type OpenedIntent,
} from '../appointments/appointments.service';
import { AppointmentEntity } from '../appointments/appointment.entity';
import { CLOCK, type Clock } from '../common/clock/clock';
import type { AppConfig } from '../config/app.config';
import { staffShopId } from '../common/staff-shop';
import { ConflictError, InvalidInputError, NotFoundError } from '../common/errors/domain-errors';
import type { RequestUser } from '../common/decorators/current-user.decorator';
import { MailOutbox } from '../mail/outbox/mail-outbox';
import { Shop } from '../shops/shop.entity';
import type { ShopServiceEntity } from '../shop-services/shop-service.entity';
import { User } from '../users/user.entity';
import {
  errorCode,
  isRefusal,
  PaymentGateway,
  type PaymentEvent,
  type PaymentIntent,
} from './payment-gateway';
import { PaymentEventEntity } from './payment-event.entity';
import { PaymentRefundEntity } from './payment-refund.entity';
import { PaymentEntity } from './payment.entity';
import { money, paymentMail } from './payment-mails';
import { insideWindow, refundFor } from './refund-policy';
import { ER_DUP_ENTRY, ER_LOCK_DEADLOCK, errno, retryAborted } from '../appointments/booking-errors';

const SECOND = 1000;
/** A refund or a cancellation tried and not answered is tried again after this, doubling, up to an hour. */
const RETRY_BASE_MS = 15 * SECOND;
const RETRY_MAX_MS = 3_600_000;
/** Attempts before a refund is marked failed (an owner then sees it in Workshop → Payments). */
const MAX_ATTEMPTS = 12;
/** While one instance calls the service for a row, the others leave it alone this long. */
const LEASE_MS = 60 * SECOND;
/** The rider's browser may ask us to check a payment this often per appointment (more is answered from the database). */
const SYNC_EVERY_MS = SECOND;

const UNPAID: readonly PaymentState[] = [
  'requires_payment_method',
  'requires_confirmation',
  'requires_action',
  'processing',
];

/**
 * The money side of bookings (docs/payments.md). A held appointment is written only with its
 * payment intent; the webhook (or the rider's browser asking us to check) moves it to requested
 * when the service says the intent succeeded — once, whatever the order or number of deliveries,
 * because the payment row is locked and only ever moves forward. Refunds and cancellations of
 * intents are written in the transaction of the change that causes them, then made at the
 * service by a worker with idempotency keys derived from our rows.
 */
@Injectable()
export class PaymentsService implements AppointmentPayments, OnModuleInit {
  private readonly logger = new Logger(PaymentsService.name);
  private working: Promise<void> | null = null;
  private readonly lastSync = new Map<string, number>();
  private again = false;

  constructor(
    @InjectDataSource() private readonly db: DataSource,
    private readonly gateway: PaymentGateway,
    private readonly appointments: AppointmentsService,
    private readonly outbox: MailOutbox,
    private readonly config: ConfigService,
    @Inject(CLOCK) private readonly clock: Clock,
  ) {}

  onModuleInit(): void {
    this.appointments.attachPayments(this);
  }

  clientConfig(): PaymentsClientConfig {
    return { publishableKey: this.gateway.publishableKey, scriptUrl: this.gateway.scriptUrl };
  }

  /* ---------------------------------------------------------------- booking */

  async openIntent(p: {
    appointmentId: string;
    shop: Shop;
    service: ShopServiceEntity;
    riderId: string;
    holdExpiresAt: Date;
  }): Promise<OpenedIntent> {
    const kind = p.service.depositMinor >= p.service.priceMinor ? 'full' : 'deposit';
    const intent = await this.gateway.createIntent({
      appointmentId: p.appointmentId,
      amountMinor: p.service.depositMinor,
      currency: p.shop.currency,
      description: `${kind === 'full' ? '' : 'Deposit: '}${p.service.name} at ${p.shop.name}`,
      shopId: p.shop.id,
      riderId: p.riderId,
    });
    return {
      intentId: intent.id,
      status: intent.status as PaymentState,
      kind,
      amountMinor: p.service.depositMinor,
      currency: p.shop.currency,
      session: {
        clientSecret: intent.client_secret ?? '',
        publishableKey: this.gateway.publishableKey,
        scriptUrl: this.gateway.scriptUrl,
        amountMinor: p.service.depositMinor,
        currency: p.shop.currency,
        kind,
        holdExpiresAt: DateTime.fromJSDate(p.holdExpiresAt, { zone: p.shop.timeZone }).toISO({
          suppressMilliseconds: true,
        })!,
      },
    };
  }

  async abandonIntent(intentId: string, appointmentId: string): Promise<void> {
    try {
      await this.gateway.cancel(intentId, appointmentId);
    } catch (e) {
      this.logger.warn(`could not cancel the intent of a booking that failed (${intentId}): ${String(e)}`);
    }
  }

  /** What the payment step needs to continue paying a held appointment (a reload, another tab). */
  async session(user: RequestUser, appointmentId: string) {
    const { a, p } = await this.riderPayment(user, appointmentId);
    if (a.status !== 'held' || !p || p.status === 'succeeded')
      throw new ConflictError('Nothing is due on this appointment.');
    if (a.holdExpiresAt && a.holdExpiresAt.getTime() <= this.clock.now().getTime())
      throw new ConflictError('The hold on this time has ended. Pick a time again.');
    const intent = await this.gateway.retrieve(p.intentId);
    const shop = a.shop!;
    return {
      clientSecret: intent.client_secret ?? '',
      publishableKey: this.gateway.publishableKey,
      scriptUrl: this.gateway.scriptUrl,
      amountMinor: p.amountMinor,
      currency: p.currency,
      kind: p.kind,
      holdExpiresAt: DateTime.fromJSDate(a.holdExpiresAt!, { zone: shop.timeZone }).toISO({
        suppressMilliseconds: true,
      })!,
    };
  }

  /** The rider's browser says it paid: ask the service (never trust the browser) and apply what it says. */
  async sync(user: RequestUser, appointmentId: string) {
    const { p } = await this.riderPayment(user, appointmentId);
    // at most one question to the service per appointment a second, however often the browser asks
    const last = this.lastSync.get(appointmentId) ?? 0;
    const now = Date.now();
    if (p && UNPAID.includes(p.status) && now - last >= SYNC_EVERY_MS) {
      this.lastSync.set(appointmentId, now);
      if (this.lastSync.size > 10_000) this.lastSync.clear();
      await this.reconcile(await this.gateway.retrieve(p.intentId));
    }
    return this.appointments.getMine(user, appointmentId);
  }

  private async riderPayment(user: RequestUser, appointmentId: string) {
    const a = await this.db
      .getRepository(AppointmentEntity)
      .findOne({ where: { id: appointmentId, riderId: user.id }, relations: { shop: true } });
    if (!a) throw new NotFoundError('No such appointment.');
    const p = await this.db.getRepository(PaymentEntity).findOneBy({ appointmentId });
    return { a, p };
  }

  /* ---------------------------------------------------------------- webhook */

  /**
   * One webhook delivery: the signature is checked on the raw body (400 if forged, unsigned or
   * stale), the event id is stored once (a second delivery changes nothing), and the intent's
   * state is applied in the same transaction, so a failure leaves the event to be delivered again.
   */
  async webhook(rawBody: Buffer | undefined, signature: string | undefined): Promise<{ received: true }> {
    if (!rawBody || !signature)
      throw new InvalidInputError('The webhook needs its raw JSON body and a Stripe-Signature header.');
    let event: PaymentEvent;
    try {
      event = this.gateway.verifyEvent(rawBody, signature);
    } catch (e) {
      this.logger.warn(`webhook refused: ${(e as Error).message}`);
      throw new InvalidInputError('The webhook signature is not valid.');
    }
    const obj = event.data.object as { object?: string; id?: string; payment_intent?: unknown };
    let intent = obj.object === 'payment_intent' ? (event.data.object as PaymentIntent) : null;
    if (intent?.status === 'succeeded' && typeof intent.latest_charge === 'string') {
      // the event carries the charge's id only: ask for it, for the card on the receipt
      intent = await this.gateway.retrieve(intent.id).catch(() => intent);
    }
    const intentId =
      obj.object === 'payment_intent'
        ? (obj.id ?? null)
        : typeof obj.payment_intent === 'string'
          ? obj.payment_intent
          : null;
    const mails = await retryAborted(() =>
      this.db.transaction(async (m) => {
        try {
          await m.insert(PaymentEventEntity, { id: event.id, type: event.type, intentId });
        } catch (e) {
          if (errno(e) === ER_DUP_ENTRY) return null; // delivered before: already acted on
          throw e;
        }
        if (intent) return this.applyIntent(m, intent);
        if (obj.object === 'refund') return this.applyRefund(m, event.data.object as Stripe.Refund);
        return [];
      }),
    );
    if (mails) this.afterChange(mails);
    return { received: true };
  }

  /** Applies the intent as the service has it (from a webhook or a retrieve). */
  async reconcile(intent: PaymentIntent): Promise<void> {
    const mails = await retryAborted(() => this.db.transaction((m) => this.applyIntent(m, intent)));
    this.afterChange(mails);
  }

  /**
   * The one place a payment changes state. Locks the row; a payment only moves forward (unpaid →
   * succeeded or canceled), so an old event arriving late, or the same news twice, changes nothing.
   */
  private async applyIntent(m: EntityManager, intent: PaymentIntent): Promise<string[]> {
    const p = await m.findOne(PaymentEntity, {
      where: { intentId: intent.id },
      lock: { mode: 'pessimistic_write' },
    });
    if (!p) return []; // not one of ours
    if (p.status === 'succeeded' || p.status === 'canceled') return [];
    const status = intent.status as PaymentState;
    if (status === 'succeeded') return this.paid(m, p, intent);
    const patch: Partial<PaymentEntity> = { status };
    if (status === 'canceled') patch.cancelWanted = false;
    if (intent.last_payment_error?.message) patch.lastError = intent.last_payment_error.message.slice(0, 500);
    await m.update(PaymentEntity, { id: p.id }, patch);
    return [];
  }

  private async paid(m: EntityManager, p: PaymentEntity, intent: PaymentIntent): Promise<string[]> {
    const charge = typeof intent.latest_charge === 'object' ? intent.latest_charge : null;
    const card = charge?.payment_method_details?.card ?? null;
    const now = this.clock.now();
    await m.update(
      PaymentEntity,
      { id: p.id },
      {
        status: 'succeeded',
        paidMinor: intent.amount_received,
        paidAt: now,
        lastError: null,
        cancelWanted: false,
        cardBrand: card?.brand?.slice(0, 20) ?? null,
        cardLast4: card?.last4 ?? null,
      },
    );
    Object.assign(p, { status: 'succeeded', paidMinor: intent.amount_received, paidAt: now });
    const a = await m.findOne(AppointmentEntity, {
      where: { id: p.appointmentId },
      lock: { mode: 'pessimistic_write' },
    });
    if (!a) return [];
    const mails: string[] = [];
    if (a.status === 'held') {
      mails.push(...(await this.appointments.applyAsSystem(m, a.id, 'paid')));
      mails.push(await this.mail(m, 'receipt', a, p));
    } else {
      // The hold ended (expired, or the rider cancelled) before the money arrived: all of it goes back.
      const d = refundFor({
        event: 'late-payment',
        side: 'system',
        paidMinor: p.paidMinor,
        refundedMinor: 0,
        chargedMinor: p.amountMinor,
        nowMs: now.getTime(),
        startMs: a.startAt.getTime(),
        cancellationWindowHours: 0,
      });
      if (d) {
        await this.addRefund(m, p, { ...d, requestKey: `late:${p.id}`, actorId: null, side: 'system' });
        mails.push(await this.mail(m, a.status === 'expired' ? 'late-payment' : 'paid-after-cancel', a, p));
      }
    }
    return mails;
  }

  /** A refund's news from the service (made by us: its state; made elsewhere: ignored). */
  private async applyRefund(m: EntityManager, refund: Stripe.Refund): Promise<string[]> {
    const row = await m.findOneBy(PaymentRefundEntity, { refundRef: refund.id });
    if (!row || row.status !== 'pending') return [];
    if (refund.status === 'succeeded')
      await m.update(PaymentRefundEntity, { id: row.id }, { status: 'succeeded', doneAt: this.clock.now() });
    return [];
  }

  /* ---------------------------------------------------------------- appointment changes */

  /** Hears every appointment change inside its transaction: payment rows, refunds, cancellations. */
  async changed(change: AppointmentChange, m: EntityManager): Promise<string[]> {
    const a = change.appointment;
    if (change.event === 'created') {
      if (change.intent)
        await m.insert(PaymentEntity, {
          appointmentId: a.id,
          shopId: a.shopId,
          intentId: change.intent.intentId,
          kind: change.intent.kind,
          amountMinor: change.intent.amountMinor,
          currency: change.intent.currency,
          status: change.intent.status,
        });
      return [];
    }
    if (change.event === 'move' && change.side === 'rider' && change.previousStart) {
      // moved from inside the old time's window: the deposit was due already; the move keeps it so
      const shop = await m.findOneByOrFail(Shop, { id: a.shopId });
      const inside = insideWindow({
        nowMs: this.clock.now().getTime(),
        startMs: change.previousStart.getTime(),
        cancellationWindowHours: shop.cancellationWindowHours,
      });
      if (inside)
        await m.update(PaymentEntity, { appointmentId: a.id, status: 'succeeded' }, { depositKept: true });
      return [];
    }
    if (change.event !== 'expire' && change.event !== 'cancel' && change.event !== 'decline') return [];
    const p = await m.findOne(PaymentEntity, {
      where: { appointmentId: a.id },
      lock: { mode: 'pessimistic_write' },
    });
    if (!p) return [];
    if (p.status !== 'succeeded') {
      if (change.event === 'expire' && p.lastError)
        change.moneyLines = [`The last payment attempt did not go through: ${p.lastError}`];
      if (p.status !== 'canceled')
        await m.update(PaymentEntity, { id: p.id }, { cancelWanted: true, nextAttemptAt: this.clock.now() });
      return [];
    }
    const shop = await m.findOneByOrFail(Shop, { id: a.shopId });
    const refunded = await this.refundedMinor(m, p.id);
    const d = refundFor({
      event: change.event === 'decline' ? 'decline' : 'cancel',
      side: change.side,
      paidMinor: p.paidMinor,
      refundedMinor: refunded,
      chargedMinor: p.amountMinor,
      nowMs: this.clock.now().getTime(),
      startMs: a.startAt.getTime(),
      cancellationWindowHours: shop.cancellationWindowHours,
      depositKept: p.depositKept,
    });
    const fmt = (n: number) => money(n, p.currency);
    if (!d) {
      change.moneyLines = [
        `The ${fmt(p.paidMinor - refunded)} paid is kept under the shop's cancellation rules.`,
      ];
      return [];
    }
    await this.addRefund(m, p, {
      ...d,
      requestKey: `${change.event}:${a.id}`,
      actorId: change.actorId,
      side: change.side,
    });
    change.moneyLines = [
      `${fmt(d.amountMinor)} comes back to your card${d.amountMinor < p.paidMinor - refunded ? ` (the deposit of ${fmt(p.paidMinor - refunded - d.amountMinor)} is kept: cancelled inside the shop's cancellation window)` : ''}; a receipt follows when it is done.`,
    ];
    return [];
  }

  afterCommit(): void {
    this.kick();
  }

  private afterChange(mails: string[]): void {
    this.appointments.afterCommit(mails);
    this.kick();
  }

  /* ---------------------------------------------------------------- refunds */

  private async addRefund(
    m: EntityManager,
    p: PaymentEntity,
    r: {
      kind: PaymentRefundEntity['kind'];
      amountMinor: number;
      reason: string;
      requestKey: string;
      actorId: string | null;
      side: 'rider' | 'staff' | 'system';
    },
  ): Promise<PaymentRefundEntity> {
    const row = m.create(PaymentRefundEntity, {
      paymentId: p.id,
      requestKey: r.requestKey,
      amountMinor: r.amountMinor,
      kind: r.kind,
      reason: r.reason.slice(0, 500),
      actorId: r.actorId,
      actorSide: r.side,
      status: 'pending',
      nextAttemptAt: this.clock.now(),
    });
    await m.insert(PaymentRefundEntity, row);
    return row;
  }

  private async refundedMinor(m: EntityManager, paymentId: string): Promise<number> {
    const r = await m
      .createQueryBuilder(PaymentRefundEntity, 'r')
      .select('COALESCE(SUM(r.amount_minor), 0)', 'sum')
      .where("r.payment_id = :paymentId AND r.status <> 'failed'", { paymentId })
      .getRawOne<{ sum: string | number }>();
    return Number(r?.sum ?? 0);
  }

  /** An owner gives money back by hand (full or part); the same `requestId` twice refunds once. */
  async refundByHand(
    user: RequestUser,
    paymentId: string,
    body: { amountMinor: number; reason: string; requestId: string },
  ): Promise<WorkshopPaymentRow> {
    const shopId = staffShopId(user);
    const key = `manual:${body.requestId}`;
    await retryAborted(() =>
      this.db.transaction(async (m) => {
        const p = await m.findOne(PaymentEntity, {
          where: { id: paymentId, shopId },
          lock: { mode: 'pessimistic_write' },
        });
        if (!p) throw new NotFoundError('No such payment at this shop.');
        const existing = await m.findOneBy(PaymentRefundEntity, { requestKey: key });
        if (existing) {
          if (existing.paymentId !== p.id || existing.amountMinor !== body.amountMinor)
            throw new ConflictError(
              'That refund form was already sent with another amount or for another payment. Open a new one.',
            );
          return; // a repeated submit: the first one stands
        }
        if (body.reason.trim().length < 3)
          throw new InvalidInputError('reason: say why, in a few words', {
            reason: 'say why, in a few words',
          });
        if (p.status !== 'succeeded') throw new ConflictError('Nothing was paid on this booking.');
        const left = p.paidMinor - (await this.refundedMinor(m, p.id));
        if (body.amountMinor > left)
          throw new InvalidInputError(`amountMinor: at most ${left} is left to refund`, {
            amountMinor:
              left > 0 ? `at most ${money(left, p.currency)} is left to refund` : 'nothing is left to refund',
          });
        await this.addRefund(m, p, {
          kind: 'manual',
          amountMinor: body.amountMinor,
          reason: body.reason.trim(),
          requestKey: key,
          actorId: user.id,
          side: 'staff',
        });
      }),
    );
    await this.settle(); // the owner sees the refund made (or why not) in the answer
    return this.workshopRow(user, paymentId);
  }

  /* ---------------------------------------------------------------- the worker */

  /** Makes due refunds and cancellations soon (after a commit), without waiting for the schedule. */
  kick(): void {
    if (this.working) {
      this.again = true;
      return;
    }
    this.working = this.settle()
      .then(() => undefined)
      .catch((e: unknown) => this.logger.warn(`settling payments failed, will retry: ${String(e)}`))
      .finally(() => {
        this.working = null;
        if (this.again) {
          this.again = false;
          this.kick();
        }
      });
  }

  /** Waits for a settle run in flight (tests, shutdown). */
  async idle(): Promise<void> {
    while (this.working) await this.working;
  }

  /**
   * One pass over what is due: pending refunds, then intents to cancel. Each row is claimed with a
   * conditional update (a lease), so two app instances never work on the same row at once, and
   * the idempotency keys make even a lost lease harmless.
   */
  async settle(): Promise<{ refunds: number; cancels: number }> {
    let refunds = 0;
    let cancels = 0;
    const now = this.clock.now();
    const due = await this.db
      .getRepository(PaymentRefundEntity)
      .createQueryBuilder('r')
      .select('r.id')
      .where("r.status = 'pending' AND r.next_attempt_at <= :now", { now })
      .orderBy('r.next_attempt_at')
      .limit(50)
      .getMany();
    for (const { id } of due) if (await this.makeRefund(id)) refunds++;
    const toCancel = await this.db
      .getRepository(PaymentEntity)
      .createQueryBuilder('p')
      .select('p.id')
      .where('p.cancel_wanted = 1 AND p.next_attempt_at <= :now', { now })
      .orderBy('p.next_attempt_at')
      .limit(50)
      .getMany();
    for (const { id } of toCancel) if (await this.cancelIntent(id)) cancels++;
    return { refunds, cancels };
  }

  /**
   * The lease: a conditional UPDATE only one instance wins. On a Galera cluster two nodes may both
   * change the row; the later commit fails certification (1213), or Galera retries the statement
   * (wsrep_retry_autocommit) and it then changes nothing — either way that instance lost.
   */
  private async claim(table: 'payment_refunds' | 'payments', id: string, extra: string): Promise<boolean> {
    const now = this.clock.now();
    try {
      const res = await this.db.query<{ affectedRows?: number }>(
        `UPDATE ${table} SET next_attempt_at = ? WHERE id = ? AND next_attempt_at <= ? AND ${extra}`,
        [new Date(now.getTime() + LEASE_MS), id, now],
      );
      return !!res.affectedRows;
    } catch (e) {
      if (errno(e) === ER_LOCK_DEADLOCK) return false;
      throw e;
    }
  }

  private backoff(attempts: number): Date {
    return new Date(this.clock.now().getTime() + Math.min(RETRY_MAX_MS, RETRY_BASE_MS * 2 ** (attempts - 1)));
  }

  private async makeRefund(id: string): Promise<boolean> {
    if (!(await this.claim('payment_refunds', id, "status = 'pending'"))) return false;
    const r = await this.db.getRepository(PaymentRefundEntity).findOneOrFail({
      where: { id },
      relations: { payment: true },
    });
    const p = r.payment!;
    try {
      const made = await this.gateway.refund({
        refundId: r.id,
        intentId: p.intentId,
        amountMinor: r.amountMinor,
        appointmentId: p.appointmentId,
        kind: r.kind,
      });
      const mails = await this.db.transaction(async (m) => {
        await m.update(
          PaymentRefundEntity,
          { id },
          {
            status: made.status === 'failed' || made.status === 'canceled' ? 'failed' : 'succeeded',
            refundRef: made.id,
            attempts: r.attempts + 1,
            lastError: made.failure_reason ?? null,
            doneAt: this.clock.now(),
          },
        );
        const a = await m.findOneByOrFail(AppointmentEntity, { id: p.appointmentId });
        return [await this.mail(m, 'refund', a, p, r)];
      });
      this.appointments.afterCommit(mails);
      return true;
    } catch (e) {
      const attempts = r.attempts + 1;
      const refused = isRefusal(e);
      const failed = refused || attempts >= MAX_ATTEMPTS;
      this.logger.warn(`refund ${id} ${failed ? 'failed' : 'will be retried'}: ${String(e)}`);
      await this.db.getRepository(PaymentRefundEntity).update(
        { id },
        {
          attempts,
          lastError: (e as Error).message.slice(0, 500),
          ...(failed ? { status: 'failed' as const } : { nextAttemptAt: this.backoff(attempts) }),
        },
      );
      return false;
    }
  }

  private async cancelIntent(id: string): Promise<boolean> {
    if (!(await this.claim('payments', id, 'cancel_wanted = 1'))) return false;
    const p = await this.db.getRepository(PaymentEntity).findOneByOrFail({ id });
    try {
      const intent = await this.gateway.cancel(p.intentId, p.appointmentId);
      await this.reconcile(intent);
      return true;
    } catch (e) {
      if (errorCode(e) === 'payment_intent_unexpected_state') {
        // Already succeeded (paid as the hold ended) or canceled: apply what it is now.
        await this.reconcile(await this.gateway.retrieve(p.intentId));
        await this.db
          .getRepository(PaymentEntity)
          .update({ id, status: 'canceled' }, { cancelWanted: false });
        return false;
      }
      const attempts = p.cancelAttempts + 1;
      this.logger.warn(`cancelling intent ${p.intentId} will be retried: ${String(e)}`);
      await this.db
        .getRepository(PaymentEntity)
        .update({ id }, { cancelAttempts: attempts, nextAttemptAt: this.backoff(attempts) });
      return false;
    }
  }

  /* ---------------------------------------------------------------- mails */

  private async mail(
    m: EntityManager,
    kind: 'receipt' | 'late-payment' | 'paid-after-cancel' | 'refund',
    a: AppointmentEntity,
    p: PaymentEntity,
    refund?: PaymentRefundEntity,
  ): Promise<string> {
    const [shop, rider] = await Promise.all([
      m.findOneByOrFail(Shop, { id: a.shopId }),
      m.findOneByOrFail(User, { id: a.riderId }),
    ]);
    const service = await m.query<{ name: string }[]>('SELECT name FROM shop_services WHERE id = ?', [
      a.serviceId,
    ]);
    const refunded = await this.refundedMinor(m, p.id);
    const out = paymentMail(kind, rider.email, {
      riderName: rider.name,
      shopName: shop.name,
      shopTown: shop.town,
      serviceName: service[0]?.name ?? 'your service',
      timeZone: shop.timeZone,
      start: a.startAt,
      currency: p.currency,
      priceMinor: a.priceMinor,
      paidMinor: p.paidMinor,
      paidAt: p.paidAt,
      card: p.cardBrand && p.cardLast4 ? { brand: p.cardBrand, last4: p.cardLast4 } : null,
      refundedMinor: refunded,
      refund: refund ? { amountMinor: refund.amountMinor, reason: refund.reason } : null,
      link: `${this.config.getOrThrow<AppConfig>('app').url}/appointments/${a.id}`,
      appointmentId: a.id,
    });
    return this.outbox.enqueue(m, out, { kind: `payment-${kind}`, refId: a.id });
  }

  /* ---------------------------------------------------------------- views */

  async receipts(rows: AppointmentEntity[]): Promise<Map<string, AppointmentReceipt>> {
    const out = new Map<string, AppointmentReceipt>();
    if (!rows.length) return out;
    const payments = await this.db.getRepository(PaymentEntity).find({
      where: { appointmentId: In(rows.map((r) => r.id)) },
      relations: { refunds: { actor: true } },
    });
    const byAppointment = new Map(payments.map((p) => [p.appointmentId, p]));
    const now = this.clock.now().getTime();
    for (const a of rows) {
      const p = byAppointment.get(a.id);
      if (!p) continue;
      const payment = summary(p, a, a.shop!.timeZone);
      const d = refundFor({
        event: 'cancel',
        side: 'rider',
        paidMinor: payment.paidMinor,
        refundedMinor: payment.refundedMinor,
        chargedMinor: p.amountMinor,
        nowMs: now,
        startMs: a.startAt.getTime(),
        cancellationWindowHours: a.shop!.cancellationWindowHours,
        depositKept: p.depositKept,
      });
      out.set(a.id, { payment, refundIfCancelledMinor: d?.amountMinor ?? 0 });
    }
    return out;
  }

  async workshopList(user: RequestUser, q: { from?: string; to?: string }) {
    const shop = await this.db.getRepository(Shop).findOneByOrFail({ id: staffShopId(user) });
    const zone = shop.timeZone;
    const today = DateTime.fromJSDate(this.clock.now(), { zone }).startOf('day');
    const day = (v: string | undefined, field: string, fallback: DateTime) => {
      if (v === undefined || v === '') return fallback;
      const d = DateTime.fromISO(v, { zone });
      if (!/^\d{4}-\d{2}-\d{2}$/.test(v) || !d.isValid)
        throw new InvalidInputError(`${field}: must be a date YYYY-MM-DD`, {
          [field]: 'must be a date YYYY-MM-DD',
        });
      return d.startOf('day');
    };
    const to = day(q.to, 'to', today);
    const from = day(q.from, 'from', to.minus({ days: 29 }));
    if (to < from)
      throw new InvalidInputError('to: must not be before from', { to: 'must not be before from' });
    if (to.diff(from, 'days').days > 366)
      throw new InvalidInputError('to: at most a year at once', { to: 'at most a year at once' });
    const start = from.toJSDate();
    const end = to.plus({ days: 1 }).toJSDate();
    const payments = await this.db
      .getRepository(PaymentEntity)
      .createQueryBuilder('p')
      .leftJoinAndSelect('p.refunds', 'r')
      .leftJoinAndSelect('r.actor', 'actor')
      .leftJoinAndSelect('p.appointment', 'a')
      .leftJoinAndSelect('a.service', 's')
      .leftJoinAndSelect('a.rider', 'rider')
      .where('p.shop_id = :shopId', { shopId: shop.id })
      .andWhere(
        '((p.created_at >= :start AND p.created_at < :end) OR (p.paid_at >= :start AND p.paid_at < :end) OR (r.created_at >= :start AND r.created_at < :end))',
        { start, end },
      )
      .orderBy('p.created_at', 'DESC')
      .take(2000)
      .getMany();
    const rows = payments.map((p) => this.row(p, shop));
    const days = new Map<
      string,
      { paidMinor: number; refundedMinor: number; payments: number; refunds: number }
    >();
    const bucket = (at: Date) => {
      const key = DateTime.fromJSDate(at, { zone }).toISODate()!;
      let b = days.get(key);
      if (!b) days.set(key, (b = { paidMinor: 0, refundedMinor: 0, payments: 0, refunds: 0 }));
      return b;
    };
    const inRange = (at: Date | null) => !!at && at >= start && at < end;
    for (const p of payments) {
      if (p.status === 'succeeded' && inRange(p.paidAt)) {
        const b = bucket(p.paidAt!);
        b.paidMinor += p.paidMinor;
        b.payments++;
      }
      for (const r of p.refunds ?? [])
        if (r.status !== 'failed' && inRange(r.createdAt)) {
          const b = bucket(r.createdAt);
          b.refundedMinor += r.amountMinor;
          b.refunds++;
        }
    }
    const dayRows = [...days.entries()]
      .sort(([x], [y]) => (x < y ? 1 : -1))
      .map(([d, b]) => ({ day: d, ...b, netMinor: b.paidMinor - b.refundedMinor }));
    const paidMinor = dayRows.reduce((s, d) => s + d.paidMinor, 0);
    const refundedMinor = dayRows.reduce((s, d) => s + d.refundedMinor, 0);
    return {
      currency: shop.currency,
      from: from.toISODate()!,
      to: to.toISODate()!,
      rows,
      days: dayRows,
      totals: { paidMinor, refundedMinor, netMinor: paidMinor - refundedMinor },
    };
  }

  async workshopRow(user: RequestUser, paymentId: string): Promise<WorkshopPaymentRow> {
    const p = await this.db.getRepository(PaymentEntity).findOne({
      where: { id: paymentId, shopId: staffShopId(user) },
      relations: { refunds: { actor: true }, appointment: { service: true, rider: true } },
    });
    if (!p) throw new NotFoundError('No such payment at this shop.');
    const shop = await this.db.getRepository(Shop).findOneByOrFail({ id: p.shopId });
    return this.row(p, shop);
  }

  private row(p: PaymentEntity, shop: Shop): WorkshopPaymentRow {
    const a = p.appointment!;
    const zone = shop.timeZone;
    const rider = a.rider!;
    return {
      ...summary(p, a, zone),
      appointmentId: a.id,
      appointmentStatus: a.status,
      start: DateTime.fromJSDate(a.startAt, { zone }).toISO({ suppressMilliseconds: true })!,
      serviceName: a.service?.name ?? '',
      rider: { id: rider.id, name: rider.name, email: rider.email },
      intentId: p.intentId,
      createdAt: DateTime.fromJSDate(p.createdAt, { zone }).toISO({ suppressMilliseconds: true })!,
    };
  }
}

/** The receipt of one payment, as riders and staff see it. */
export function summary(p: PaymentEntity, a: AppointmentEntity, zone: string): PaymentSummary {
  const iso = (d: Date | null) =>
    d ? DateTime.fromJSDate(d, { zone }).toISO({ suppressMilliseconds: true }) : null;
  const refunds: RefundView[] = [...(p.refunds ?? [])]
    .sort((x, y) => x.createdAt.getTime() - y.createdAt.getTime())
    .map((r) => ({
      id: r.id,
      amountMinor: r.amountMinor,
      kind: r.kind,
      reason: r.reason,
      by: r.actorSide,
      byName: r.actorSide === 'staff' ? (r.actor?.name ?? null) : null,
      status: r.status,
      createdAt: iso(r.createdAt)!,
    }));
  const refundedMinor = refunds.filter((r) => r.status !== 'failed').reduce((s, r) => s + r.amountMinor, 0);
  const live = a.status === 'held' || a.status === 'requested' || a.status === 'confirmed';
  const paid = p.status === 'succeeded' ? p.paidMinor : 0;
  return {
    id: p.id,
    status: p.status,
    kind: p.kind,
    currency: p.currency,
    amountMinor: p.amountMinor,
    paidMinor: paid,
    paidAt: iso(p.paidAt),
    card: p.cardBrand && p.cardLast4 ? { brand: p.cardBrand, last4: p.cardLast4 } : null,
    refundedMinor,
    netMinor: paid - refundedMinor,
    balanceDueMinor: live ? Math.max(0, a.priceMinor - (paid || p.amountMinor)) : 0,
    lastError: p.status === 'succeeded' ? null : p.lastError,
    refunds,
  };
}
