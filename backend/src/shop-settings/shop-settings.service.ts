import { Injectable } from '@nestjs/common';
import { InjectDataSource, InjectRepository } from '@nestjs/typeorm';
import { DateTime } from 'luxon';
import type { DataSource, Repository } from 'typeorm';
import type { OpeningInterval, ShopClosure, ShopSettings } from '@loamline/shared-types';
import {
  type AvailabilityRules,
  type Closure,
  GRID_MINUTES,
  isKnownTimeZone,
  type WeeklyInterval,
} from '../appointments/availability/availability';
import { ConflictError, InvalidInputError, NotFoundError } from '../common/errors/domain-errors';
import { ClosureEntity } from '../shops/closure.entity';
import { OpeningIntervalEntity } from '../shops/opening-interval.entity';
import { Shop } from '../shops/shop.entity';
import { AvailabilityCache } from './availability-cache';

/** "09:30" → 570 */
export const toMinute = (hhmm: string): number => Number(hhmm.slice(0, 2)) * 60 + Number(hhmm.slice(3, 5));
/** 570 → "09:30" */
export const fromMinute = (m: number): string =>
  `${String(Math.floor(m / 60)).padStart(2, '0')}:${String(m % 60).padStart(2, '0')}`;

/** Everything availability needs about a shop, read once. */
export interface ShopCalendar {
  shop: Shop;
  hours: WeeklyInterval[];
  closures: Closure[];
  rules: AvailabilityRules;
}

const CURRENCIES = new Set(Intl.supportedValuesOf('currency'));

/**
 * How long the availability route reuses a shop's calendar once read (ms). A change made through
 * this instance is seen at once (`put` forgets every kept calendar); another instance's change
 * within this time. Bookings never use the kept one: they read the calendar afresh.
 */
export const CALENDAR_REUSE_MS = 1000;
const CALENDAR_REUSE_MAX = 1000;

/**
 * A shop's hours, closures, benches and booking rules (Workshop → Hours & rules). The owner
 * replaces them as a whole; every rule is checked (an IANA zone, intervals on the 5-minute grid
 * that do not overlap, closures in order).
 */
@Injectable()
export class ShopSettingsService {
  constructor(
    @InjectRepository(Shop) private readonly shops: Repository<Shop>,
    @InjectRepository(OpeningIntervalEntity) private readonly intervals: Repository<OpeningIntervalEntity>,
    @InjectRepository(ClosureEntity) private readonly closures: Repository<ClosureEntity>,
    @InjectDataSource() private readonly db: DataSource,
    private readonly availability: AvailabilityCache,
  ) {}

  /** calendars by shop slug as the availability route last read them (a pending read included) */
  private readonly recent = new Map<string, { at: number; cal: Promise<ShopCalendar | null> }>();

  /**
   * The calendar of the shop with this slug (null: no such shop), as read within the last
   * CALENDAR_REUSE_MS: for the free times a rider is shown, which every calendar view asks for
   * again and again, so that a busy shop's hours and closures are read about once a second instead
   * of on every request. Concurrent requests share one read.
   */
  recentCalendarBySlug(slug: string): Promise<ShopCalendar | null> {
    const now = performance.now();
    const hit = this.recent.get(slug);
    if (hit && now - hit.at < CALENDAR_REUSE_MS) return hit.cal;
    const cal = this.shops.findOneBy({ slug }).then((shop) => (shop ? this.calendarOf(shop) : null));
    const entry = { at: now, cal };
    if (this.recent.size >= CALENDAR_REUSE_MAX) this.recent.clear();
    this.recent.set(slug, entry);
    // neither a failed read nor "no such shop" is kept
    const drop = (): void => {
      if (this.recent.get(slug) === entry) this.recent.delete(slug);
    };
    cal.then((c) => (c ? undefined : drop()), drop);
    return cal;
  }

  async calendar(shopId: string): Promise<ShopCalendar> {
    const shop = await this.shops.findOneBy({ id: shopId });
    if (!shop) throw new NotFoundError('No such shop.');
    return this.calendarOf(shop);
  }

  /** The calendar of a shop row the caller has just read (one read of the shop fewer). */
  async calendarOf(shop: Shop): Promise<ShopCalendar> {
    const shopId = shop.id;
    const [hours, closures] = await Promise.all([
      this.intervals.find({ where: { shopId }, order: { weekday: 'ASC', startMinute: 'ASC' } }),
      this.closures.find({ where: { shopId }, order: { fromDate: 'ASC' } }),
    ]);
    return {
      shop,
      hours: hours.map(({ weekday, startMinute, endMinute }) => ({ weekday, startMinute, endMinute })),
      closures: closures.map((c) => ({ from: c.fromDate, to: c.toDate })),
      rules: {
        slotStepMinutes: shop.slotStepMinutes,
        minNoticeMinutes: shop.minNoticeMinutes,
        maxDaysAhead: shop.maxDaysAhead,
      },
    };
  }

  async get(shopId: string): Promise<ShopSettings> {
    const shop = await this.shops.findOneBy({ id: shopId });
    if (!shop) throw new NotFoundError('No such shop.');
    const [hours, closures] = await Promise.all([
      this.intervals.find({ where: { shopId }, order: { weekday: 'ASC', startMinute: 'ASC' } }),
      this.closures.find({ where: { shopId }, order: { fromDate: 'ASC' } }),
    ]);
    return {
      timeZone: shop.timeZone,
      currency: shop.currency,
      benches: shop.benches,
      hours: hours.map((h) => ({
        weekday: h.weekday,
        start: fromMinute(h.startMinute),
        end: fromMinute(h.endMinute),
      })),
      closures: closures.map((c) => ({ from: c.fromDate, to: c.toDate, reason: c.reason })),
      rules: {
        slotStepMinutes: shop.slotStepMinutes,
        minNoticeMinutes: shop.minNoticeMinutes,
        maxDaysAhead: shop.maxDaysAhead,
        holdMinutes: shop.holdMinutes,
        cancellationWindowHours: shop.cancellationWindowHours,
      },
    };
  }

  async put(shopId: string, s: ShopSettings): Promise<ShopSettings> {
    validateSettings(s);
    await this.db.transaction(async (m) => {
      // Prices, deposits and payments are minor units of the shop's currency: once a service has a
      // price or anything was booked, a new currency would reread every amount (€59.00 → ¥59).
      const shop = await m.findOne(Shop, { where: { id: shopId }, lock: { mode: 'pessimistic_write' } });
      if (!shop) throw new NotFoundError('No such shop.');
      if (shop.currency !== s.currency) {
        const priced = await m.query<{ n: number }[]>(
          `SELECT (SELECT COUNT(*) FROM shop_services WHERE shop_id = ? AND (price_minor > 0 OR deposit_minor > 0))
                + (SELECT COUNT(*) FROM appointments WHERE shop_id = ?) AS n`,
          [shopId, shopId],
        );
        if (Number(priced[0]?.n ?? 0) > 0)
          throw new ConflictError(
            `The currency stays ${shop.currency}: prices and bookings are kept in it. A shop that changes currency needs a person to convert its prices.`,
            { currency: `stays ${shop.currency} once services have prices or anything was booked` },
          );
      }
      const updated = await m.update(
        Shop,
        { id: shopId },
        {
          timeZone: s.timeZone,
          currency: s.currency,
          benches: s.benches,
          slotStepMinutes: s.rules.slotStepMinutes,
          minNoticeMinutes: s.rules.minNoticeMinutes,
          maxDaysAhead: s.rules.maxDaysAhead,
          holdMinutes: s.rules.holdMinutes,
          cancellationWindowHours: s.rules.cancellationWindowHours,
        },
      );
      if (!updated.affected) throw new NotFoundError('No such shop.');
      await m.delete(OpeningIntervalEntity, { shopId });
      await m.delete(ClosureEntity, { shopId });
      if (s.hours.length)
        await m.insert(
          OpeningIntervalEntity,
          s.hours.map((h) => ({
            shopId,
            weekday: h.weekday,
            startMinute: toMinute(h.start),
            endMinute: toMinute(h.end),
          })),
        );
      if (s.closures.length)
        await m.insert(
          ClosureEntity,
          s.closures.map((c) => ({ shopId, fromDate: c.from, toDate: c.to, reason: c.reason.trim() })),
        );
    });
    this.recent.clear();
    this.availability.forgetShop(shopId);
    return this.get(shopId);
  }
}

/** The rules a shop's settings must follow; a 400 names each bad field. */
export function validateSettings(s: ShopSettings): void {
  const fields: Record<string, string> = {};
  if (!isKnownTimeZone(s.timeZone)) fields.timeZone = 'must be an IANA time-zone name, e.g. Europe/Berlin';
  if (!CURRENCIES.has(s.currency)) fields.currency = 'must be an ISO 4217 currency code';
  if (s.rules.slotStepMinutes % GRID_MINUTES !== 0)
    fields['rules.slotStepMinutes'] = `must be a multiple of ${GRID_MINUTES} minutes`;
  s.hours.forEach((h: OpeningInterval, i) => {
    const start = toMinute(h.start);
    const end = toMinute(h.end);
    if (start % GRID_MINUTES || end % GRID_MINUTES)
      fields[`hours.${i}`] = `opening times must be on the ${GRID_MINUTES}-minute grid`;
    else if (end <= start) fields[`hours.${i}`] = 'must close after it opens';
  });
  for (let weekday = 1; weekday <= 7; weekday++) {
    const day = s.hours
      .map((h, i) => ({ i, start: toMinute(h.start), end: toMinute(h.end), weekday: h.weekday }))
      .filter((h) => h.weekday === weekday)
      .sort((a, b) => a.start - b.start);
    for (let k = 1; k < day.length; k++)
      if (day[k].start < day[k - 1].end) fields[`hours.${day[k].i}`] = 'overlaps another interval that day';
  }
  s.closures.forEach((c: ShopClosure, i) => {
    const from = DateTime.fromISO(c.from);
    const to = DateTime.fromISO(c.to);
    if (!from.isValid) fields[`closures.${i}.from`] = 'must be a real date';
    else if (!to.isValid) fields[`closures.${i}.to`] = 'must be a real date';
    else if (to < from) fields[`closures.${i}.to`] = 'must not be before the first closed day';
    if (!c.reason.trim()) fields[`closures.${i}.reason`] = 'say why the shop is closed';
  });
  const names = Object.keys(fields);
  if (names.length) {
    throw new InvalidInputError(names.map((n) => `${n}: ${fields[n]}`).join('; '), fields);
  }
}
