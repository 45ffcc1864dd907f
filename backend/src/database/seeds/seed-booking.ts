import { randomBytes } from 'node:crypto';
import type { INestApplicationContext } from '@nestjs/common';
import { DateTime } from 'luxon';
import { DataSource } from 'typeorm';
import { AppointmentCellEntity } from '../../appointments/appointment-cell.entity';
import { AppointmentEventEntity } from '../../appointments/appointment-event.entity';
import { AppointmentEntity } from '../../appointments/appointment.entity';
import { describeBike } from '../../appointments/appointments.service';
import { gridCells, isClosed, wallClock } from '../../appointments/availability/availability';
import { PasswordHasher } from '../../auth/password-hasher';
import { BaselineSheet } from '../../baseline-sheets/baseline-sheet.entity';
import { Bike } from '../../bikes/bike.entity';
import { CLOCK, type Clock } from '../../common/clock/clock';
import { ShopServicesService } from '../../shop-services/shop-services.service';
import { ShopServiceEntity } from '../../shop-services/shop-service.entity';
import { ShopSettingsService, toMinute } from '../../shop-settings/shop-settings.service';
import { Shop } from '../../shops/shop.entity';
import { UsersService } from '../../users/users.service';
import { DEMO_APPOINTMENTS, DEMO_BOOKING, DEMO_GUESTS } from './demo-booking';
import { DEMO_RIDERS } from './demo-data';
import { DemoPayments } from './seed-payments';

const MINUTE = 60_000;

/**
 * Gives each demo shop its hours, closure, rules, services and a spread of appointments in every
 * state (through the app's own settings and services code; appointments written directly, since
 * most lie in the past). Once per shop: a shop that already has services is left alone.
 */
export async function seedBooking(app: INestApplicationContext): Promise<void> {
  const db = app.get(DataSource);
  const settings = app.get(ShopSettingsService);
  const services = app.get(ShopServicesService);
  const users = app.get(UsersService);
  const hasher = app.get(PasswordHasher);
  const now = app.get<Clock>(CLOCK).now();
  const payments = new DemoPayments(app);
  const money = await payments.reachable();
  if (!money) console.warn('loamline seed: the payment service does not answer; demo payments left out');

  const guests = [];
  for (const g of DEMO_GUESTS) {
    const found = await users.findByEmail(g.email);
    guests.push(
      found ??
        (await users.create({
          email: g.email,
          name: g.name,
          role: 'rider',
          shopId: null,
          passwordHash: await hasher.hash(randomBytes(18).toString('base64url')),
        })),
    );
  }

  for (const [i, demo] of DEMO_BOOKING.entries()) {
    const shop = await db.getRepository(Shop).findOneByOrFail({ slug: demo.slug });
    if (await db.getRepository(ShopServiceEntity).existsBy({ shopId: shop.id })) continue;
    const today = DateTime.fromJSDate(now, { zone: shop.timeZone }).startOf('day');
    const closureFrom = today.plus({ days: demo.closure.inDays });
    await settings.put(shop.id, {
      timeZone: shop.timeZone,
      currency: shop.currency,
      benches: demo.benches,
      hours: demo.hours,
      closures: [
        {
          from: closureFrom.toISODate()!,
          to: closureFrom.plus({ days: demo.closure.days - 1 }).toISODate()!,
          reason: demo.closure.reason,
        },
      ],
      rules: demo.rules,
    });
    const created = [];
    for (const s of demo.services) created.push(await services.create(shop.id, { ...s, active: true }));
    const cal = await settings.calendar(shop.id);

    // the demo rider who lives near this shop, with their bike and sheet
    const demoRider = await users.findByEmail(DEMO_RIDERS[i].email);
    const bike = demoRider ? await db.getRepository(Bike).findOneBy({ ownerId: demoRider.id }) : null;
    const sheet = demoRider
      ? await db.getRepository(BaselineSheet).findOneBy({ ownerId: demoRider.id })
      : null;

    /** The n-th open day from today (negative: before) on which `at` + the service fits the hours. */
    const openDay = (n: number, at: number, minutes: number): DateTime => {
      let d = today;
      let left = Math.abs(n);
      for (;;) {
        d = d.plus({ days: Math.sign(n) });
        const fits = cal.hours.some(
          (h) => h.weekday === d.weekday && h.startMinute <= at && at + minutes <= h.endMinute,
        );
        if (fits && !isClosed(d, cal.closures) && --left === 0) return d;
      }
    };

    for (const [k, a] of DEMO_APPOINTMENTS.entries()) {
      const service = created[a.service];
      const at = toMinute(a.at);
      const start = wallClock(openDay(a.day, at, service.durationMinutes), at)!;
      const rider = a.rider === 'demo' && demoRider ? demoRider : guests[k % guests.length];
      const mine = a.rider === 'demo' && demoRider;
      const startAt = start.toJSDate();
      const live = a.status === 'held' || a.status === 'requested' || a.status === 'confirmed';
      const proposed = a.proposeDay
        ? wallClock(openDay(a.proposeDay, at, service.durationMinutes), at)!.toJSDate()
        : null;
      const row = await db.transaction(async (m) => {
        const row = m.create(AppointmentEntity, {
          shopId: shop.id,
          serviceId: service.id,
          riderId: rider.id,
          bikeId: mine && bike ? bike.id : null,
          bikeSnapshot: mine && bike ? { name: bike.name, description: describeBike(bike) } : null,
          baselineSheetId: mine && sheet ? sheet.id : null,
          notes: a.notes ?? '',
          status: a.status,
          startAt,
          endAt: new Date(startAt.getTime() + service.durationMinutes * MINUTE),
          keepUntil: new Date(
            startAt.getTime() + (service.durationMinutes + service.bufferAfterMinutes) * MINUTE,
          ),
          bench: 1,
          holdExpiresAt:
            a.status === 'held' ? new Date(now.getTime() + demo.rules.holdMinutes * MINUTE) : null,
          priceMinor: service.priceMinor,
          depositMinor: service.depositMinor,
          currency: shop.currency,
          proposedStartAt: proposed,
          declineReason: a.status === 'declined' ? (a.reason ?? null) : null,
          cancelReason: a.status === 'cancelled' ? (a.reason ?? null) : null,
        });
        await m.insert(AppointmentEntity, row);
        if (live) {
          const cells = gridCells(startAt.getTime(), service.durationMinutes + service.bufferAfterMinutes);
          await m.insert(
            AppointmentCellEntity,
            cells.map((t) => ({ shopId: shop.id, bench: 1, cellAt: new Date(t), appointmentId: row.id })),
          );
        }
        await m.insert(AppointmentEventEntity, {
          appointmentId: row.id,
          event: 'created',
          actorId: rider.id,
          detail: null,
        });
        const event = {
          completed: 'complete',
          no_show: 'no-show',
          declined: 'decline',
          cancelled: 'cancel',
          expired: 'expire',
          confirmed: 'confirm',
        }[a.status as string];
        if (event)
          await m.insert(AppointmentEventEntity, {
            appointmentId: row.id,
            event,
            actorId: null,
            detail: a.reason ? { reason: a.reason } : null,
          });
        return row;
      });
      if (money) await payments.seed(row, `${service.name} at ${shop.name}`);
    }
  }
}
