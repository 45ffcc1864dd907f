import { Inject, Injectable, Logger } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import { randomUUID } from 'node:crypto';
import { DateTime } from 'luxon';
import { type DataSource, type EntityManager, In } from 'typeorm';
import type {
  Appointment,
  AppointmentCreated,
  AppointmentHistoryEntry,
  AppointmentState,
  CreateAppointmentRequest,
  PaymentSession,
  PaymentState,
  PaymentSummary,
  WorkshopAppointment,
} from '@loamline/shared-types';
import { BaselineSheet } from '../baseline-sheets/baseline-sheet.entity';
import { Bike } from '../bikes/bike.entity';
import { CLOCK, type Clock } from '../common/clock/clock';
import type { RequestUser } from '../common/decorators/current-user.decorator';
import {
  ConflictError,
  InvalidInputError,
  NotFoundError,
  UnavailableError,
} from '../common/errors/domain-errors';
import { staffShopId } from '../common/staff-shop';
import { AvailabilityCache } from '../shop-settings/availability-cache';
import { type ShopCalendar, ShopSettingsService } from '../shop-settings/shop-settings.service';
import { ShopServiceEntity } from '../shop-services/shop-service.entity';
import { Shop } from '../shops/shop.entity';
import { User } from '../users/user.entity';
import { AppointmentCellEntity } from './appointment-cell.entity';
import { AppointmentEventEntity } from './appointment-event.entity';
import { AppointmentEntity } from './appointment.entity';
import {
  type Actor as TransitionActor,
  type AppointmentEvent,
  canTransition,
  transition,
  TransitionRefused,
} from './appointment-transitions';
import {
  availability,
  AvailabilityInputError,
  type BusyInterval,
  gridCells,
} from './availability/availability';
import { CellTakenError, ER_DUP_ENTRY, TIME_TAKEN, errno, retryAborted } from './booking-errors';

const MINUTE = 60_000;

/** What changed, for the mails and the calendar file (the notifier sends them) and the payments. */
export interface AppointmentChange {
  appointment: AppointmentEntity;
  event: AppointmentEvent | 'created' | 'reminder';
  /** who caused it */
  side: TransitionActor;
  /** the state before (for a state change) */
  from?: AppointmentState;
  actorId: string | null;
  previousStart?: Date;
  /** on `created` of a held appointment: the payment intent made for it */
  intent?: OpenedIntent;
  /** lines the payments add to the rider's mail about this change ("£20.00 comes back to your card.") */
  moneyLines?: string[];
}

/** A payment intent made for an appointment before it is written. */
export interface OpenedIntent {
  intentId: string;
  status: PaymentState;
  kind: 'deposit' | 'full';
  amountMinor: number;
  currency: string;
  session: PaymentSession;
}

/**
 * What booking needs from payments (the payments module attaches itself at start-up, so the two
 * modules do not import each other): an intent before a held appointment is written, and the
 * receipts for the views.
 */
export interface AppointmentPayments extends AppointmentListener {
  openIntent(p: {
    appointmentId: string;
    shop: Shop;
    service: ShopServiceEntity;
    riderId: string;
    holdExpiresAt: Date;
  }): Promise<OpenedIntent>;
  /** the booking failed after the intent was made: cancel it at the service (best effort) */
  abandonIntent(intentId: string, appointmentId: string): Promise<void>;
  receipts(rows: AppointmentEntity[]): Promise<Map<string, AppointmentReceipt>>;
}

export interface AppointmentReceipt {
  payment: PaymentSummary;
  refundIfCancelledMinor: number;
}

/**
 * Hears every change inside its transaction (and writes what it sends to the outbox there), then
 * `afterCommit` with what it wrote once the transaction committed.
 */
export interface AppointmentListener {
  changed(change: AppointmentChange, m: EntityManager): Promise<string[]>;
  afterCommit(ids: string[]): void;
}
export const APPOINTMENT_LISTENER = Symbol('APPOINTMENT_LISTENER');

/**
 * Bookings and everything that happens to them. Capacity is kept by the database itself: a live
 * appointment owns one `appointment_cells` row per 5-minute cell of its bench time, and the primary
 * key (shop, bench, cell) refuses a second owner whatever the interleaving, also on a multi-primary
 * cluster, where the loser's commit fails certification as a deadlock and is retried. State
 * changes follow the one transition table, guarded by the row's version (two staff confirming at
 * once: one wins, the other gets 409).
 */
@Injectable()
export class AppointmentsService {
  private readonly logger = new Logger(AppointmentsService.name);
  private payments: AppointmentPayments | null = null;
  /** other modules that hear every change (the service reports), after the notifier */
  private readonly listeners: AppointmentListener[] = [];
  /** the payments first (they add what a mail says about money), then the notifier, then the others */
  private readonly listener: AppointmentListener;

  constructor(
    @InjectDataSource() private readonly db: DataSource,
    private readonly settings: ShopSettingsService,
    @Inject(CLOCK) private readonly clock: Clock,
    @Inject(APPOINTMENT_LISTENER) notifier: AppointmentListener,
    private readonly availabilityCache: AvailabilityCache,
  ) {
    // shops whose bench time changed in a transaction not yet committed
    const touched = new Set<string>();
    this.listener = {
      changed: async (change, m) => {
        touched.add(change.appointment.shopId);
        this.availabilityCache.forgetShop(change.appointment.shopId);
        const ids = [
          ...(this.payments ? await this.payments.changed(change, m) : []),
          ...(await notifier.changed(change, m)),
        ];
        for (const l of this.listeners) ids.push(...(await l.changed(change, m)));
        return ids;
      },
      // every mail id written in the change, whoever wrote it, goes to each listener
      afterCommit: (ids) => {
        // again once committed: an answer worked out meanwhile may have read the old bench time
        for (const shopId of touched) this.availabilityCache.forgetShop(shopId);
        touched.clear();
        notifier.afterCommit(ids);
        this.payments?.afterCommit(ids);
        for (const l of this.listeners) l.afterCommit(ids);
      },
    };
  }

  /** Called once by the payments module at start-up. */
  attachPayments(p: AppointmentPayments): void {
    this.payments = p;
  }

  /**
   * A module that hears every appointment change inside its transaction (after the payments and
   * the notifier), e.g. the service reports on `complete`; called once at its start-up.
   */
  addListener(l: AppointmentListener): void {
    this.listeners.push(l);
  }

  /* ---------------------------------------------------------------- availability */

  /**
   * The free starts as the JSON the route sends: the answer this instance worked out within the
   * last second (availability-cache.ts), else the shop's calendar as read within the last second
   * (shop-settings.service.ts), the service and the bench time read now.
   */
  availabilityJson(slug: string, serviceId: string, from: string, to: string): Promise<string> {
    return this.availabilityCache.answerJson(JSON.stringify([slug, serviceId, from, to]), async () => {
      const cal = await this.settings.recentCalendarBySlug(slug);
      if (!cal) throw new NotFoundError('No such shop.');
      const starts = await this.freeStarts(
        cal.shop,
        this.activeService(cal.shop.id, serviceId),
        from,
        to,
        cal,
      );
      return {
        shopId: cal.shop.id,
        starts: starts.map(({ start, end, benchesFree }) => ({ start, end, benchesFree })),
      };
    });
  }

  /**
   * The service (read by the caller, or passed as its pending read), the shop's hours and closures
   * (unless given) and the bench time in the range are read at once, on the pool's connections.
   */
  private async freeStarts(
    shop: Shop,
    serviceRead: ShopServiceEntity | Promise<ShopServiceEntity>,
    from: string,
    to: string,
    calendar?: ShopCalendar,
  ) {
    const now = this.clock.now().getTime();
    const fromMs = DateTime.fromISO(from, { zone: shop.timeZone }).minus({ days: 1 }).toMillis();
    const toMs = DateTime.fromISO(to, { zone: shop.timeZone }).plus({ days: 2 }).toMillis();
    const [service, cal, busy] = await Promise.all([
      serviceRead,
      calendar ?? this.settings.calendarOf(shop),
      Number.isFinite(fromMs) && Number.isFinite(toMs) ? this.busy(shop.id, fromMs, toMs, now) : [],
    ]);
    try {
      return availability({
        timeZone: shop.timeZone,
        hours: cal.hours,
        closures: cal.closures,
        benches: shop.benches,
        rules: cal.rules,
        service: { durationMinutes: service.durationMinutes, bufferAfterMinutes: service.bufferAfterMinutes },
        busy,
        from,
        to,
        nowMs: now,
      });
    } catch (e) {
      if (e instanceof AvailabilityInputError) throw new InvalidInputError(e.message);
      throw e;
    }
  }

  /** Bench time kept by live appointments (a held one only until its hold expires). */
  private async busy(shopId: string, fromMs: number, toMs: number, nowMs: number): Promise<BusyInterval[]> {
    // plain SQL, no query builder: three columns of rows IDX_appointments_shop_live covers
    const rows = await this.db.query<{ bench: number; start_at: Date; keep_until: Date }[]>(
      `SELECT a.bench, a.start_at, a.keep_until FROM appointments a
        WHERE a.shop_id = ? AND a.start_at < ? AND a.keep_until > ?
          AND (a.status IN ('requested', 'confirmed') OR (a.status = 'held' AND a.hold_expires_at > ?))`,
      [shopId, new Date(toMs), new Date(fromMs), new Date(nowMs)],
    );
    return rows.map((r) => ({
      bench: Number(r.bench),
      startMs: r.start_at.getTime(),
      endMs: r.keep_until.getTime(),
    }));
  }

  /* ---------------------------------------------------------------- booking */

  async book(user: RequestUser, dto: CreateAppointmentRequest): Promise<AppointmentCreated> {
    const shop = await this.shopBySlug(dto.shopSlug);
    const service = await this.activeService(shop.id, dto.serviceId);
    const startMs = this.parseStart(dto.start, 'start');
    const bike = dto.bikeId ? await this.ownBike(user, dto.bikeId) : null;
    if (dto.baselineSheetId) await this.ownSheet(user, dto.baselineSheetId);
    await this.requireOffered(shop, service, startMs, 'start');
    await this.expireDue(shop.id);
    const now = this.clock.now();
    const held = service.depositMinor > 0;
    const endMs = startMs + service.durationMinutes * MINUTE;
    const clash = await this.db
      .getRepository(AppointmentEntity)
      .createQueryBuilder('a')
      .where('a.rider_id = :rider AND a.start_at < :end AND a.end_at > :start', {
        rider: user.id,
        start: new Date(startMs),
        end: new Date(endMs),
      })
      .andWhere("a.status IN ('held', 'requested', 'confirmed')")
      .getExists();
    if (clash) throw new ConflictError('You already have an appointment at that time.');
    const id = randomUUID();
    const holdExpiresAt = held ? new Date(now.getTime() + shop.holdMinutes * MINUTE) : null;
    // A held appointment exists only with its payment intent: made first, with a key derived from
    // the appointment's id, so the service down means nothing is booked and no hold is left.
    let intent: OpenedIntent | undefined;
    if (held) {
      if (!this.payments) throw new UnavailableError("Online payment isn't set up, so nothing was booked.");
      intent = await this.payments.openIntent({
        appointmentId: id,
        shop,
        service,
        riderId: user.id,
        holdExpiresAt: holdExpiresAt!,
      });
    }
    const a = await retryAborted(() =>
      this.db.transaction(async (m) => {
        const row = m.create(AppointmentEntity, {
          id,
          shopId: shop.id,
          serviceId: service.id,
          riderId: user.id,
          bikeId: bike?.id ?? null,
          bikeSnapshot: bike ? { name: bike.name, description: describeBike(bike) } : null,
          baselineSheetId: dto.baselineSheetId ?? null,
          notes: (dto.notes ?? '').trim(),
          status: held ? 'held' : 'requested',
          startAt: new Date(startMs),
          endAt: new Date(startMs + service.durationMinutes * MINUTE),
          keepUntil: new Date(startMs + (service.durationMinutes + service.bufferAfterMinutes) * MINUTE),
          bench: 0,
          holdExpiresAt,
          priceMinor: service.priceMinor,
          depositMinor: service.depositMinor,
          currency: shop.currency,
        });
        await this.claimBench(m, shop, row, null);
        await m.insert(AppointmentEventEntity, {
          appointmentId: row.id,
          event: 'created',
          actorId: user.id,
          detail: null,
        });
        const mails = await this.listener.changed(
          { appointment: row, event: 'created', side: 'rider', actorId: user.id, intent },
          m,
        );
        return { row, mails };
      }),
    ).catch(async (e: unknown) => {
      if (intent) await this.payments?.abandonIntent(intent.intentId, id);
      throw e;
    });
    this.listener.afterCommit(a.mails);
    return {
      id: a.row.id,
      status: a.row.status,
      ...(a.row.holdExpiresAt ? { holdExpiresAt: a.row.holdExpiresAt.toISOString() } : {}),
      ...(intent ? { payment: intent.session } : {}),
    };
  }

  /**
   * Gives `a` a bench for its time: inserts the appointment (new) or moves it (existing), then one
   * cell row per 5-minute cell on the first bench whose cells are all free. 409 when none is. When
   * another booking took one of those cells since the read (a duplicate key), the whole transaction
   * is tried again (`CellTakenError`, retried by `retryAborted`), and the next read sees the cell
   * taken. No savepoint: on a Galera cluster, rows rolled back to a savepoint can stay in the
   * transaction's write set, and the other nodes then fail to apply it (seen with MariaDB 10.11 and
   * Galera 4: a duplicate appointment row, and the cluster evicting nodes as inconsistent).
   */
  private async claimBench(m: EntityManager, shop: Shop, a: AppointmentEntity, existing: string | null) {
    const cells = gridCells(a.startAt.getTime(), (a.keepUntil.getTime() - a.startAt.getTime()) / MINUTE);
    const taken = await m
      .createQueryBuilder(AppointmentCellEntity, 'c')
      .select('DISTINCT c.bench', 'bench')
      .where('c.shop_id = :shopId AND c.cell_at >= :from AND c.cell_at <= :to', {
        shopId: shop.id,
        from: new Date(cells[0]),
        to: new Date(cells[cells.length - 1]),
      })
      .andWhere(existing ? 'c.appointment_id <> :existing' : '1 = 1', { existing })
      .getRawMany<{ bench: number }>();
    const busy = new Set(taken.map((t) => Number(t.bench)));
    const bench = [...Array(shop.benches).keys()].map((i) => i + 1).find((b) => !busy.has(b));
    if (bench === undefined) throw new ConflictError(TIME_TAKEN);
    a.bench = bench;
    if (existing) {
      await m.delete(AppointmentCellEntity, { appointmentId: a.id });
      await m.update(
        AppointmentEntity,
        { id: a.id },
        { bench, startAt: a.startAt, endAt: a.endAt, keepUntil: a.keepUntil },
      );
    } else {
      await m.insert(AppointmentEntity, a);
    }
    try {
      await m
        .createQueryBuilder()
        .insert()
        .into(AppointmentCellEntity)
        .values(cells.map((t) => ({ shopId: shop.id, bench, cellAt: new Date(t), appointmentId: a.id })))
        .execute();
    } catch (e) {
      if (errno(e) === ER_DUP_ENTRY) throw new CellTakenError(TIME_TAKEN);
      throw e;
    }
    if (existing) a.version += 1; // TypeORM raises the version column on every update
  }

  /**
   * A page never shows a hold as live after it ended: reading expires the reader's lapsed holds
   * first (the schedule does the rest within a minute). True when something expired.
   */
  private async expireLapsedOf(where: { riderId?: string; id?: string }): Promise<boolean> {
    const lapsed = await this.db
      .getRepository(AppointmentEntity)
      .createQueryBuilder('a')
      .select(['a.id', 'a.shopId'])
      .where("a.status = 'held' AND a.hold_expires_at <= :now", { now: this.clock.now() })
      .andWhere(where.id ? 'a.id = :id' : 'a.rider_id = :riderId', where)
      .limit(20)
      .getMany();
    for (const shopId of new Set(lapsed.map((l) => l.shopId))) await this.expireDue(shopId);
    return lapsed.length > 0;
  }

  /** Frees the time of holds whose payment window has passed (also done by the schedule). */
  async expireDue(shopId?: string): Promise<number> {
    const now = this.clock.now();
    let expired = 0;
    for (;;) {
      // On one server FOR UPDATE SKIP LOCKED keeps two instances off the same hold. On a Galera
      // cluster row locks stay on their node, so two nodes may both pick a hold; both change it
      // under its version, and at commit one loses certification (1213) and rolls back — its
      // event and mail with it. The retry then finds the hold no longer held.
      const { ids, mails } = await retryAborted(() =>
        this.db.transaction(async (m) => {
          const mails: string[] = [];
          const rows: { id: string }[] = await m.query(
            `SELECT id FROM appointments WHERE status = 'held' AND hold_expires_at <= ? ${shopId ? 'AND shop_id = ?' : ''}
           ORDER BY hold_expires_at LIMIT 50 FOR UPDATE SKIP LOCKED`,
            shopId ? [now, shopId] : [now],
          );
          for (const { id } of rows) {
            const a = await m.findOneByOrFail(AppointmentEntity, { id });
            mails.push(...(await this.apply(m, a, 'expire', { kind: 'system' }, {})));
          }
          return { ids: rows.map((r) => r.id), mails };
        }),
      );
      this.listener.afterCommit(mails);
      expired += ids.length;
      if (ids.length < 50) return expired;
    }
  }

  /**
   * The reminder, 24 hours ahead, sent once: the first instance to set `reminder_sent_at` wins the
   * row (a conditional UPDATE), and the mail is written in that same transaction.
   */
  async sendReminders(): Promise<number> {
    const now = this.clock.now();
    const due = await this.db
      .getRepository(AppointmentEntity)
      .createQueryBuilder('a')
      .select('a.id')
      .where("a.status = 'confirmed' AND a.reminder_sent_at IS NULL")
      .andWhere('a.start_at > :now AND a.start_at <= :until', {
        now,
        until: new Date(now.getTime() + 24 * 60 * MINUTE),
      })
      .orderBy('a.start_at', 'ASC')
      .limit(200)
      .getMany();
    let sent = 0;
    for (const { id } of due) {
      const mails = await this.db.transaction(async (m) => {
        const res = await m.query<{ affectedRows?: number }>(
          "UPDATE appointments SET reminder_sent_at = ? WHERE id = ? AND reminder_sent_at IS NULL AND status = 'confirmed'",
          [now, id],
        );
        if (!res.affectedRows) return [];
        const a = await m.findOneByOrFail(AppointmentEntity, { id });
        return this.listener.changed({ appointment: a, event: 'reminder', side: 'system', actorId: null }, m);
      });
      if (mails.length) sent++;
      this.listener.afterCommit(mails);
    }
    return sent;
  }

  /* ---------------------------------------------------------------- reading */

  async listMine(user: RequestUser): Promise<Appointment[]> {
    await this.expireLapsedOf({ riderId: user.id });
    const rows = await this.db.getRepository(AppointmentEntity).find({
      where: { riderId: user.id },
      relations: { shop: true, service: true },
      order: { startAt: 'DESC' },
      take: 500,
    });
    const receipts = await this.receipts(rows);
    return rows.map((a) => this.view(a, receipts.get(a.id)));
  }

  private async receipts(rows: AppointmentEntity[]): Promise<Map<string, AppointmentReceipt>> {
    const paid = rows.filter((r) => r.depositMinor > 0);
    return paid.length && this.payments ? this.payments.receipts(paid) : new Map();
  }

  async getMine(user: RequestUser, id: string): Promise<Appointment> {
    let a = await this.loadFor(user, id, 'rider');
    if (await this.expireLapsedOf({ id: a.id })) a = await this.loadFor(user, id, 'rider');
    return this.view(a, (await this.receipts([a])).get(a.id));
  }

  async listForShop(
    user: RequestUser,
    q: { status?: string; from?: string; to?: string; q?: string },
  ): Promise<WorkshopAppointment[]> {
    const shopId = staffShopId(user);
    const shop = await this.db.getRepository(Shop).findOneByOrFail({ id: shopId });
    const qb = this.db
      .getRepository(AppointmentEntity)
      .createQueryBuilder('a')
      .leftJoinAndSelect('a.shop', 'shop')
      .leftJoinAndSelect('a.service', 'service')
      .leftJoinAndSelect('a.rider', 'rider')
      .where('a.shop_id = :shopId', { shopId })
      .orderBy('a.start_at', 'ASC')
      .take(1000);
    const statuses = (q.status ?? '').split(',').filter(Boolean);
    if (statuses.length) qb.andWhere('a.status IN (:...statuses)', { statuses });
    if (q.from) qb.andWhere('a.start_at >= :from', { from: this.localDay(q.from, shop.timeZone, 'from') });
    if (q.to) qb.andWhere('a.start_at < :to', { to: this.localDay(q.to, shop.timeZone, 'to', 1) });
    if (q.q?.trim()) {
      const like = `%${q.q.trim().replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
      qb.andWhere(
        "(rider.name LIKE :like OR rider.email LIKE :like OR JSON_UNQUOTE(JSON_EXTRACT(a.bike_snapshot, '$.name')) LIKE :like)",
        { like },
      );
    }
    const rows = await qb.getMany();
    const masses = await this.massesBySheet(
      rows.map((r) => r.baselineSheetId).filter((x): x is string => !!x),
    );
    const receipts = await this.receipts(rows);
    return rows.map((a) => this.workshopView(a, masses, receipts.get(a.id)));
  }

  async getForShop(user: RequestUser, id: string): Promise<WorkshopAppointment> {
    const a = await this.loadFor(user, id, 'staff');
    const masses = await this.massesBySheet(a.baselineSheetId ? [a.baselineSheetId] : []);
    const receipts = await this.receipts([a]);
    return { ...this.workshopView(a, masses, receipts.get(a.id)), history: await this.history(a) };
  }

  /** What happened to `a`, oldest first, with the name of the staff member who did it. */
  private async history(a: AppointmentEntity): Promise<AppointmentHistoryEntry[]> {
    const events = await this.db
      .getRepository(AppointmentEventEntity)
      .find({ where: { appointmentId: a.id }, order: { createdAt: 'ASC' } });
    const actorIds = [...new Set(events.map((e) => e.actorId).filter((x): x is string => !!x))];
    const actors = actorIds.length
      ? await this.db
          .getRepository(User)
          .find({ select: { id: true, name: true }, where: { id: In(actorIds) } })
      : [];
    const names = new Map(actors.map((u) => [u.id, u.name]));
    const zone = a.shop!.timeZone;
    const local = (v: unknown) =>
      typeof v === 'string' ? DateTime.fromISO(v, { zone }).toISO({ suppressMilliseconds: true }) : null;
    return events.map((e) => {
      const detail = e.detail ?? {};
      const by = !e.actorId ? 'system' : e.actorId === a.riderId ? 'rider' : 'staff';
      return {
        event: e.event,
        at: DateTime.fromJSDate(e.createdAt, { zone }).toISO({ suppressMilliseconds: true })!,
        by,
        byName: by === 'staff' && e.actorId ? (names.get(e.actorId) ?? null) : null,
        reason: typeof detail.reason === 'string' ? detail.reason : null,
        start: local(detail.proposedStart ?? detail.to),
      };
    });
  }

  /* ---------------------------------------------------------------- changes */

  /** Staff confirm, decline, complete, mark a no-show; riders and staff cancel. */
  async act(
    user: RequestUser,
    id: string,
    event: 'confirm' | 'decline' | 'complete' | 'no-show' | 'cancel' | 'reject-proposal',
    who: 'rider' | 'staff',
    body: { reason?: string } = {},
  ): Promise<Appointment> {
    const a = await this.loadFor(user, id, who);
    const now = this.clock.now().getTime();
    if ((event === 'complete' || event === 'no-show') && now < a.startAt.getTime())
      throw new ConflictError('An appointment can be completed or marked as a no-show once it has started.');
    if (event === 'cancel' && who === 'rider' && now >= a.startAt.getTime())
      throw new ConflictError('This appointment has started; call the shop.');
    if (event === 'reject-proposal' && !a.proposedStartAt)
      throw new ConflictError('There is no proposal to answer.');
    if (event === 'decline' && !body.reason?.trim())
      throw new InvalidInputError('reason: say why', { reason: 'say why the appointment is declined' });
    const mails = await retryAborted(() =>
      this.db.transaction(async (m) => {
        const fresh = await m.findOneByOrFail(AppointmentEntity, { id: a.id });
        return this.apply(m, fresh, event, { kind: 'user', user, side: who }, body);
      }),
    );
    this.listener.afterCommit(mails);
    return who === 'staff' ? this.getForShop(user, id) : this.getMine(user, id);
  }

  /** The rider moves to another free time, or accepts the shop's proposal (then it is confirmed). */
  async move(user: RequestUser, id: string, start: string | null): Promise<Appointment> {
    const a = await this.loadFor(user, id, 'rider');
    const event: AppointmentEvent = start === null ? 'accept-proposal' : 'move';
    const startMs = start === null ? a.proposedStartAt?.getTime() : this.parseStart(start, 'start');
    if (startMs === undefined) throw new ConflictError('There is no proposal to accept.');
    const shop = await this.db.getRepository(Shop).findOneByOrFail({ id: a.shopId });
    const service = await this.db.getRepository(ShopServiceEntity).findOneByOrFail({ id: a.serviceId });
    if (!canTransition(a.status, event, 'rider')) throw this.refused(a.status, event, 'rider');
    if (event === 'move' && this.clock.now().getTime() > a.startAt.getTime() - shop.minNoticeMinutes * MINUTE)
      throw new ConflictError('It is too late to move this appointment; call the shop.');
    await this.requireOffered(shop, service, startMs, 'start');
    const mails = await retryAborted(() =>
      this.db.transaction(async (m) => {
        const fresh = await m.findOneByOrFail(AppointmentEntity, { id: a.id });
        const previousStart = fresh.startAt;
        const to = transition(fresh.status, event, 'rider');
        fresh.startAt = new Date(startMs);
        fresh.endAt = new Date(startMs + service.durationMinutes * MINUTE);
        fresh.keepUntil = new Date(startMs + (service.durationMinutes + service.bufferAfterMinutes) * MINUTE);
        await this.claimBench(m, shop, fresh, fresh.id);
        await this.commitState(m, fresh, to, {
          proposedStartAt: null,
          sequence: fresh.sequence + 1,
          reminderSentAt: null,
        });
        await m.insert(AppointmentEventEntity, {
          appointmentId: fresh.id,
          event,
          actorId: user.id,
          detail: { from: previousStart.toISOString(), to: fresh.startAt.toISOString() },
        });
        return this.listener.changed(
          {
            appointment: Object.assign(fresh, {
              status: to,
              sequence: fresh.sequence + 1,
              proposedStartAt: null,
            }),
            event,
            side: 'rider',
            actorId: user.id,
            previousStart,
          },
          m,
        );
      }),
    );
    this.listener.afterCommit(mails);
    return this.getMine(user, id);
  }

  /** Staff propose another time; the rider accepts (a move, confirmed) or turns it down. */
  async propose(user: RequestUser, id: string, start: string): Promise<WorkshopAppointment> {
    const a = await this.loadFor(user, id, 'staff');
    const startMs = this.parseStart(start, 'start');
    const shop = await this.db.getRepository(Shop).findOneByOrFail({ id: a.shopId });
    const service = await this.db.getRepository(ShopServiceEntity).findOneByOrFail({ id: a.serviceId });
    if (startMs === a.startAt.getTime())
      throw new InvalidInputError('start: that is the time it already has', {
        start: 'propose a different time',
      });
    await this.requireOffered(shop, service, startMs, 'start');
    const mails = await this.db.transaction(async (m) => {
      const fresh = await m.findOneByOrFail(AppointmentEntity, { id: a.id });
      return this.apply(
        m,
        fresh,
        'propose',
        { kind: 'user', user, side: 'staff' },
        { proposedStartAt: new Date(startMs) },
      );
    });
    this.listener.afterCommit(mails);
    return this.getForShop(user, id);
  }

  /* ---------------------------------------------------------------- the one place a state changes */

  private async apply(
    m: EntityManager,
    a: AppointmentEntity,
    event: AppointmentEvent,
    who: { kind: 'system' } | { kind: 'user'; user: RequestUser; side: TransitionActor },
    extra: { reason?: string; proposedStartAt?: Date },
  ): Promise<string[]> {
    const side: TransitionActor = who.kind === 'system' ? 'system' : who.side;
    const from = a.status;
    let to: AppointmentState;
    try {
      to = transition(a.status, event, side);
    } catch (e) {
      if (e instanceof TransitionRefused) throw this.refused(a.status, event, side);
      throw e;
    }
    const patch: Partial<AppointmentEntity> = {};
    if (event === 'decline') patch.declineReason = extra.reason?.trim() || null;
    if (event === 'cancel') patch.cancelReason = extra.reason?.trim() || null;
    if (event === 'propose') patch.proposedStartAt = extra.proposedStartAt ?? null;
    if (event === 'reject-proposal' || event === 'confirm') patch.proposedStartAt = null;
    if (event === 'paid') patch.holdExpiresAt = null;
    if (event === 'cancel' || event === 'decline') patch.sequence = a.sequence + 1; // the calendar's CANCEL
    await this.commitState(m, a, to, patch);
    if (!['held', 'requested', 'confirmed'].includes(to)) {
      await m.delete(AppointmentCellEntity, { appointmentId: a.id }); // the time is free at once
    }
    await m.insert(AppointmentEventEntity, {
      appointmentId: a.id,
      event,
      actorId: who.kind === 'user' ? who.user.id : null,
      detail: extra.reason
        ? { reason: extra.reason.trim() }
        : extra.proposedStartAt
          ? { proposedStart: extra.proposedStartAt.toISOString() }
          : null,
    });
    Object.assign(a, patch, { status: to });
    return this.listener.changed(
      { appointment: a, event, side, from, actorId: who.kind === 'user' ? who.user.id : null },
      m,
    );
  }

  /**
   * A change the system makes for the payments (`paid`), inside their transaction; the mail ids it
   * returns go to `afterCommit` once that transaction committed.
   */
  async applyAsSystem(m: EntityManager, appointmentId: string, event: 'paid'): Promise<string[]> {
    const a = await m.findOneByOrFail(AppointmentEntity, { id: appointmentId });
    return this.apply(m, a, event, { kind: 'system' }, {});
  }

  /** Sends what `applyAsSystem` wrote, once its transaction committed. */
  afterCommit(ids: string[]): void {
    this.listener.afterCommit(ids);
  }

  /** Writes a new state only if nobody changed the row since it was read (its version). */
  private async commitState(
    m: EntityManager,
    a: AppointmentEntity,
    status: AppointmentState,
    patch: Partial<AppointmentEntity>,
  ): Promise<void> {
    const res = await m
      .createQueryBuilder()
      .update(AppointmentEntity)
      .set({ ...patch, status })
      .where('id = :id AND version = :version', { id: a.id, version: a.version })
      .execute();
    if (!res.affected) throw new ConflictError('Someone else changed this appointment just now. Reload it.');
    a.version += 1;
  }

  /* ---------------------------------------------------------------- helpers */

  private refused(state: AppointmentState, event: AppointmentEvent, side: TransitionActor): ConflictError {
    return new ConflictError(new TransitionRefused(event, state, side).message);
  }

  /** The appointment if `user` may see it from that side: its rider, or staff of its shop (else 404). */
  private async loadFor(user: RequestUser, id: string, side: TransitionActor): Promise<AppointmentEntity> {
    const where = side === 'staff' ? { id, shopId: staffShopId(user) } : { id, riderId: user.id };
    const a = await this.db.getRepository(AppointmentEntity).findOne({
      where,
      relations: { shop: true, service: true, rider: side === 'staff' },
    });
    if (!a) throw new NotFoundError('No such appointment.');
    return a;
  }

  private async shopBySlug(slug: string): Promise<Shop> {
    const shop = await this.db.getRepository(Shop).findOneBy({ slug });
    if (!shop) throw new NotFoundError('No such shop.');
    return shop;
  }

  private async activeService(shopId: string, serviceId: string): Promise<ShopServiceEntity> {
    const ok = /^[0-9a-f-]{36}$/i.test(serviceId);
    const s = ok
      ? await this.db.getRepository(ShopServiceEntity).findOneBy({ id: serviceId, shopId, active: true })
      : null;
    if (!s) throw new NotFoundError('No such service at this shop.');
    return s;
  }

  private async ownBike(user: RequestUser, id: string): Promise<Bike> {
    const bike = await this.db.getRepository(Bike).findOneBy({ id, ownerId: user.id });
    if (!bike)
      throw new InvalidInputError('bikeId: not a bike in your garage', {
        bikeId: 'not a bike in your garage',
      });
    return bike;
  }

  private async ownSheet(user: RequestUser, id: string): Promise<void> {
    if (!(await this.db.getRepository(BaselineSheet).existsBy({ id, ownerId: user.id })))
      throw new InvalidInputError('baselineSheetId: not one of your baseline sheets', {
        baselineSheetId: 'not one of your baseline sheets',
      });
  }

  private parseStart(iso: string, field: string): number {
    const t = DateTime.fromISO(iso, { setZone: true });
    if (!t.isValid || !/[zZ]|[+-]\d{2}:?\d{2}$/.test(iso))
      throw new InvalidInputError(`${field}: must be a time with its offset`, {
        [field]: 'must be an ISO-8601 time with its offset',
      });
    return t.toMillis();
  }

  /** The start must be one the shop offers for this service (hours, rules), taken or not. */
  private async requireOffered(shop: Shop, service: ShopServiceEntity, startMs: number, field: string) {
    const day = DateTime.fromMillis(startMs, { zone: shop.timeZone }).toISODate()!;
    const cal = await this.settings.calendarOf(shop);
    const offered = availability({
      timeZone: shop.timeZone,
      hours: cal.hours,
      closures: cal.closures,
      benches: shop.benches,
      rules: cal.rules,
      service: { durationMinutes: service.durationMinutes, bufferAfterMinutes: service.bufferAfterMinutes },
      busy: [],
      from: day,
      to: day,
      nowMs: this.clock.now().getTime(),
    });
    if (!offered.some((s) => Date.parse(s.start) === startMs))
      throw new ConflictError(
        "That time can't be booked: it is outside the shop's hours, too soon or too far ahead.",
        { [field]: 'not a time this shop offers' },
      );
  }

  private localDay(date: string, zone: string, field: string, plusDays = 0): Date {
    const d = DateTime.fromISO(date, { zone });
    if (!/^\d{4}-\d{2}-\d{2}$/.test(date) || !d.isValid)
      throw new InvalidInputError(`${field}: must be a date YYYY-MM-DD`, {
        [field]: 'must be a date YYYY-MM-DD',
      });
    return d.startOf('day').plus({ days: plusDays }).toJSDate();
  }

  private async massesBySheet(ids: string[]): Promise<Map<string, number>> {
    if (!ids.length) return new Map();
    const sheets = await this.db
      .getRepository(BaselineSheet)
      .find({ select: { id: true, input: true }, where: { id: In(ids) } });
    return new Map(sheets.map((s) => [s.id, s.input.rider.massKg]));
  }

  view(a: AppointmentEntity, receipt?: AppointmentReceipt): Appointment {
    const zone = a.shop!.timeZone;
    const iso = (d: Date | null) =>
      d ? DateTime.fromJSDate(d, { zone }).toISO({ suppressMilliseconds: true })! : null;
    const now = this.clock.now().getTime();
    const live = a.status === 'held' || a.status === 'requested' || a.status === 'confirmed';
    const shop = a.shop!;
    return {
      id: a.id,
      status: a.status,
      shop: {
        id: shop.id,
        slug: shop.slug,
        name: shop.name,
        town: shop.town,
        timeZone: shop.timeZone,
        currency: shop.currency,
      },
      service: {
        id: a.serviceId,
        name: a.service!.name,
        durationMinutes: a.service!.durationMinutes,
        priceMinor: a.priceMinor,
        depositMinor: a.depositMinor,
      },
      start: iso(a.startAt)!,
      end: iso(a.endAt)!,
      bench: a.bench,
      holdExpiresAt: a.status === 'held' ? iso(a.holdExpiresAt) : null,
      bike: a.bikeSnapshot && a.bikeId ? { id: a.bikeId, ...a.bikeSnapshot } : null,
      baselineSheetId: a.baselineSheetId,
      notes: a.notes,
      proposedStart: iso(a.proposedStartAt),
      declineReason: a.declineReason,
      cancelReason: a.cancelReason,
      canCancel: live && now < a.startAt.getTime(),
      canMove:
        (a.status === 'requested' || a.status === 'confirmed') &&
        now < a.startAt.getTime() - shop.minNoticeMinutes * MINUTE,
      fullRefundIfCancelled: now <= a.startAt.getTime() - shop.cancellationWindowHours * 60 * MINUTE,
      refundIfCancelledMinor: receipt?.refundIfCancelledMinor ?? 0,
      payment: receipt?.payment ?? null,
      createdAt: a.createdAt.toISOString(),
    };
  }

  private workshopView(
    a: AppointmentEntity,
    masses: Map<string, number>,
    receipt?: AppointmentReceipt,
  ): WorkshopAppointment {
    const rider = a.rider as User;
    return {
      ...this.view(a, receipt),
      rider: {
        id: rider.id,
        name: rider.name,
        email: rider.email,
        massKg: a.baselineSheetId ? (masses.get(a.baselineSheetId) ?? null) : null,
      },
    };
  }
}

/** "160 mm fork, 36 mm stanchions, air; 65 mm stroke air shock" from a garage bike. */
export function describeBike(b: Bike): string {
  const bits: string[] = [];
  if (b.fork) bits.push(`${b.fork.travelMm} mm ${b.fork.spring} fork, ${b.fork.stanchionMm} mm stanchions`);
  if (b.shock)
    bits.push(
      `${b.shock.strokeMm} mm stroke ${b.shock.spring} shock, ${b.shock.wheelTravelMm} mm rear travel`,
    );
  return bits.join('; ') || 'no suspension details';
}
