import type { OutgoingMail } from '../mail/mail.service';
import { layout } from '../mail/templates';

/** The rider's mail when the shop completes the appointment: the report is ready, with its link. */
export function reportReadyMail(
  to: string,
  f: { shopName: string; shopTown: string; serviceName: string; riderName: string; link: string },
): OutgoingMail {
  const subject = `Your service report from ${f.shopName}`;
  const lines = [
    `Hello ${f.riderName},`,
    `${f.serviceName} at ${f.shopName}, ${f.shopTown} is done.`,
    "The shop's report is ready: the work done, the settings your fork and shock were left with, and any photos and bench curves they recorded. Keep it for the next service.",
  ];
  const link = { href: f.link, label: 'See your service report' };
  return {
    to,
    subject,
    text: `${lines.join('\n\n')}\n\n${link.label}: ${link.href}\n`,
    html: layout(subject, lines, link),
  };
}
