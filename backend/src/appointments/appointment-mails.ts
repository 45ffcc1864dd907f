import { DateTime } from 'luxon';
import type { OutgoingMail } from '../mail/mail.service';
import { layout } from '../mail/templates';

/** The facts an appointment mail needs, in the shop's terms. */
export interface AppointmentMailFacts {
  shopName: string;
  shopTown: string;
  timeZone: string;
  serviceName: string;
  start: Date;
  previousStart?: Date;
  proposedStart?: Date | null;
  riderName: string;
  reason?: string | null;
  /** what happens to the money (a refund, a kept deposit), from the payments */
  moneyLines?: string[];
  link: string;
}

/** "Monday 29 March 2027, 09:00 (Europe/Berlin, CEST)": the shop's wall clock, the zone named. */
export function shopTime(at: Date, zone: string): string {
  const t = DateTime.fromJSDate(at, { zone });
  return `${t.setLocale('en-GB').toFormat('cccc d LLLL yyyy, HH:mm')} (${zone}, ${t.offsetNameShort ?? t.toFormat('ZZ')})`;
}

function mail(
  to: string,
  subject: string,
  lines: string[],
  link: { href: string; label: string },
): OutgoingMail {
  return {
    to,
    subject,
    text: `${lines.join('\n\n')}\n\n${link.label}: ${link.href}\n`,
    html: layout(subject, lines, link),
  };
}

type Kind =
  | 'request-received'
  | 'new-request'
  | 'confirmed'
  | 'declined'
  | 'cancelled'
  | 'moved'
  | 'moved-shop'
  | 'proposal'
  | 'proposal-declined'
  | 'expired'
  | 'reminder';

/** One mail of the booking's life, in Loamline's words. `to` is the rider or a member of staff. */
export function appointmentMail(kind: Kind, to: string, f: AppointmentMailFacts): OutgoingMail {
  const when = shopTime(f.start, f.timeZone);
  const at = `${f.serviceName} at ${f.shopName}, ${f.shopTown}`;
  const mine = { href: f.link, label: 'See your appointment' };
  const theirs = { href: f.link, label: 'Open it in the Workshop' };
  switch (kind) {
    case 'request-received':
      return mail(
        to,
        `Request received: ${f.serviceName}`,
        [
          `Hello ${f.riderName},`,
          `${f.shopName} has your request for ${at} on ${when}. The shop confirms it or proposes another time; we e-mail you either way.`,
        ],
        mine,
      );
    case 'new-request':
      return mail(
        to,
        `New request: ${f.serviceName}, ${when}`,
        [
          `${f.riderName} asks for ${f.serviceName} on ${when}.`,
          'Confirm it, decline it with a reason, or propose another time.',
        ],
        theirs,
      );
    case 'confirmed':
      return mail(
        to,
        `Confirmed: ${f.serviceName}, ${when}`,
        [
          `Hello ${f.riderName},`,
          `${f.shopName} confirmed ${at} on ${when}. The calendar file in this e-mail adds it to your calendar.`,
          'Bring the bike clean, with the pump you use at home if you have one.',
        ],
        mine,
      );
    case 'declined':
      return mail(
        to,
        `Declined: ${f.serviceName}`,
        [
          `Hello ${f.riderName},`,
          `${f.shopName} could not take ${at} on ${when}.${f.reason ? ` Their reason: ${f.reason}` : ''}`,
          ...(f.moneyLines ?? []),
        ],
        mine,
      );
    case 'cancelled':
      return mail(
        to,
        `Cancelled: ${f.serviceName}, ${when}`,
        [
          `${at} on ${when} is cancelled${f.reason ? `: ${f.reason}` : '.'}`,
          'The time is free again.',
          ...(f.moneyLines ?? []),
        ],
        mine,
      );
    case 'moved':
      return mail(
        to,
        `Moved: ${f.serviceName}, now ${when}`,
        [
          `Hello ${f.riderName},`,
          `Your appointment for ${at} moved${f.previousStart ? ` from ${shopTime(f.previousStart, f.timeZone)}` : ''} to ${when}. The shop confirms the new time; we e-mail you when it does.`,
        ],
        mine,
      );
    case 'moved-shop':
      return mail(
        to,
        `Moved by the rider: ${f.serviceName}, now ${when}`,
        [
          `${f.riderName} moved ${f.serviceName}${f.previousStart ? ` from ${shopTime(f.previousStart, f.timeZone)}` : ''} to ${when}. It waits for your confirmation again.`,
        ],
        theirs,
      );
    case 'proposal':
      return mail(
        to,
        `Another time for ${f.serviceName}?`,
        [
          `Hello ${f.riderName},`,
          `${f.shopName} cannot do ${when} and proposes ${f.proposedStart ? shopTime(f.proposedStart, f.timeZone) : 'another time'} instead. Accept it or turn it down on your appointment's page.`,
        ],
        mine,
      );
    case 'proposal-declined':
      return mail(
        to,
        `Proposal turned down: ${f.serviceName}`,
        [
          `${f.riderName} turned down the time you proposed. The request stays at ${when}: confirm or decline it.`,
        ],
        theirs,
      );
    case 'expired':
      return mail(
        to,
        `Not booked: ${f.serviceName}`,
        [
          `Hello ${f.riderName},`,
          `The time held for ${at} on ${when} lapsed before a payment came through, so it is not booked and nothing was charged. Book again whenever you like.`,
          ...(f.moneyLines ?? []),
        ],
        mine,
      );
    case 'reminder':
      return mail(
        to,
        `Tomorrow: ${f.serviceName}, ${when}`,
        [
          `Hello ${f.riderName},`,
          `A reminder: ${at} on ${when}.`,
          'If you cannot come, cancel or move it on your appointment’s page so that someone else can have the time.',
        ],
        mine,
      );
  }
}
