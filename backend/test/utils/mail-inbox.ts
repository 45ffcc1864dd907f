/**
 * The mail fake's JSON inbox (fakes/mail, at MAIL_URL), as tests read it: the app really sends
 * over SMTP and the tests look at what arrived.
 */
export interface InboxMessage {
  id: string;
  from: string;
  to: string[];
  subject: string;
  date: string;
  text: string;
  html: string | null;
  links: string[];
}

const mailUrl = (): string => {
  const url = process.env.MAIL_URL;
  if (!url) throw new Error('MAIL_URL is not set (npm test sets it to the mail fake)');
  return url.replace(/\/+$/, '');
};

export async function messagesTo(address: string): Promise<InboxMessage[]> {
  const res = await fetch(`${mailUrl()}/api/messages?to=${encodeURIComponent(address)}`);
  if (!res.ok) throw new Error(`mail fake answered ${res.status}`);
  return (await res.json()) as InboxMessage[];
}

/** Waits until `count` messages to the address have arrived; returns them, newest first. */
export async function waitForMail(address: string, count = 1, timeoutMs = 10_000): Promise<InboxMessage[]> {
  const until = Date.now() + timeoutMs;
  for (;;) {
    const found = await messagesTo(address);
    if (found.length >= count) return found;
    if (Date.now() > until)
      throw new Error(`no mail to ${address} within ${timeoutMs} ms (${found.length} found)`);
    await new Promise((r) => setTimeout(r, 100));
  }
}

/** The `token` query parameter of the first link in the message that goes to `path`. */
export function tokenFromLink(message: InboxMessage, path: string): { link: string; token: string } {
  const link = message.links.find((l) => new URL(l).pathname === path);
  if (!link) throw new Error(`no link to ${path} in "${message.subject}": ${message.links.join(', ')}`);
  const token = new URL(link).searchParams.get('token');
  if (!token) throw new Error(`link ${link} has no token`);
  return { link, token };
}
