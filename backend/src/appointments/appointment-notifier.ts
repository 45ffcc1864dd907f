import { Injectable } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';
import { type EntityManager, In } from 'typeorm';
import type { AppConfig } from '../config/app.config';
import { MailOutbox } from '../mail/outbox/mail-outbox';
import type { OutgoingMail } from '../mail/mail.service';
import { ShopServiceEntity } from '../shop-services/shop-service.entity';
import { Shop } from '../shops/shop.entity';
import { User } from '../users/user.entity';
import { appointmentMail, type AppointmentMailFacts } from './appointment-mails';
import type { AppointmentChange, AppointmentListener } from './appointments.service';
import { appointmentCalendarFile } from './calendar-file';

/**
 * Tells riders and shops what happened to an appointment, through the outbox: the mails are
 * written in the transaction of the change (they exist exactly when it does) and sent after it
 * commits. A confirmation, a move and a cancellation carry the calendar file.
 */
@Injectable()
export class AppointmentNotifier implements AppointmentListener {
  constructor(
    private readonly outbox: MailOutbox,
    private readonly config: ConfigService,
  ) {}

  async changed(change: AppointmentChange, m: EntityManager): Promise<string[]> {
    const a = change.appointment;
    const [shop, service, rider, staff] = await Promise.all([
      m.findOneByOrFail(Shop, { id: a.shopId }),
      m.findOneByOrFail(ShopServiceEntity, { id: a.serviceId }),
      m.findOneByOrFail(User, { id: a.riderId }),
      m.find(User, { where: { shopId: a.shopId, role: In(['owner', 'technician']) } }),
    ]);
    const base = this.config.getOrThrow<AppConfig>('app').url;
    const facts = (forStaff: boolean): AppointmentMailFacts => ({
      shopName: shop.name,
      shopTown: shop.town,
      timeZone: shop.timeZone,
      serviceName: service.name,
      start: a.startAt,
      previousStart: change.previousStart,
      proposedStart: a.proposedStartAt,
      riderName: rider.name,
      reason: a.declineReason ?? a.cancelReason,
      moneyLines: forStaff ? undefined : change.moneyLines,
      link: forStaff ? `${base}/workshop/appointments/${a.id}` : `${base}/appointments/${a.id}`,
    });
    const calendar = (method: 'REQUEST' | 'CANCEL'): OutgoingMail['icalEvent'] => ({
      method,
      filename: 'appointment.ics',
      content: appointmentCalendarFile(
        {
          id: a.id,
          start: a.startAt,
          end: a.endAt,
          timeZone: shop.timeZone,
          sequence: a.sequence,
          summary: `${service.name} — ${shop.name}`,
          description: `${service.name} at ${shop.name}, ${shop.town}.`,
          location: `${shop.name}, ${shop.town}`,
          url: `${base}/appointments/${a.id}`,
          cancelled: method === 'CANCEL',
        },
        new URL(base).hostname,
      ),
    });
    const toRider = (
      kind: Parameters<typeof appointmentMail>[0],
      ics?: 'REQUEST' | 'CANCEL',
    ): OutgoingMail => ({
      ...appointmentMail(kind, rider.email, facts(false)),
      ...(ics ? { icalEvent: calendar(ics) } : {}),
    });
    const toStaff = (kind: Parameters<typeof appointmentMail>[0]): OutgoingMail[] =>
      staff.map((s) => appointmentMail(kind, s.email, facts(true)));

    const mails: OutgoingMail[] = [];
    switch (change.event) {
      case 'created':
        if (a.status === 'requested') mails.push(toRider('request-received'), ...toStaff('new-request'));
        break;
      case 'paid':
        mails.push(toRider('request-received'), ...toStaff('new-request'));
        break;
      case 'confirm':
      case 'accept-proposal':
        mails.push(toRider('confirmed', 'REQUEST'));
        break;
      case 'decline':
        mails.push(toRider('declined', 'CANCEL'));
        break;
      case 'cancel':
        // a hold never reached the shop as a request: nothing to tell its staff
        mails.push(toRider('cancelled', 'CANCEL'), ...(change.from === 'held' ? [] : toStaff('cancelled')));
        break;
      case 'move':
        mails.push(toRider('moved', 'REQUEST'), ...toStaff('moved-shop'));
        break;
      case 'propose':
        mails.push(toRider('proposal'));
        break;
      case 'reject-proposal':
        mails.push(...toStaff('proposal-declined'));
        break;
      case 'expire':
        mails.push(toRider('expired'));
        break;
      case 'reminder':
        mails.push(toRider('reminder'));
        break;
      default:
        break;
    }
    const ids: string[] = [];
    for (const mail of mails) {
      ids.push(await this.outbox.enqueue(m, mail, { kind: `appointment-${change.event}`, refId: a.id }));
    }
    return ids;
  }

  afterCommit(ids: string[]): void {
    if (ids.length) this.outbox.sendSoon(ids);
  }
}
