import { randomUUID } from 'node:crypto';
import type { AddressObject, EmailAddress, ParsedMail } from 'mailparser';

/** One received message as the JSON inbox shows it (the shape agreed in the mail fake's interface). */
export interface MailMessage {
  id: string;
  /** The From header as mailparser formats it, display name included (`"Loamline" <no-reply@…>`). */
  from: string;
  /** The To addresses (the envelope recipients when the message has no To header). */
  to: string[];
  subject: string;
  /** ISO 8601; the Date header, or the time it arrived when the header is missing or unreadable. */
  date: string;
  text: string;
  html: string | null;
  links: string[];
}

interface Stored {
  message: MailMessage;
  /** Every recipient in lower case: To, Cc, Bcc and the SMTP envelope (RCPT TO). */
  recipients: Set<string>;
  raw: Buffer;
}

/** The messages in memory, oldest dropped once `capacity` is reached. */
export class MailStore {
  /** Insertion order is arrival order, so the first key is the oldest message. */
  private readonly items = new Map<string, Stored>();

  constructor(readonly capacity = 500) {
    if (!Number.isInteger(capacity) || capacity < 1) throw new Error('capacity must be a positive integer');
  }

  get size(): number {
    return this.items.size;
  }

  /** Keeps a parsed message and its source; `envelopeTo` are the RCPT TO addresses. */
  add(parsed: ParsedMail, raw: Buffer, envelopeTo: string[] = [], receivedAt = new Date()): MailMessage {
    const headerTo = addresses(parsed.to);
    const message: MailMessage = {
      id: randomUUID(),
      from: parsed.from?.text ?? '',
      to: headerTo.length > 0 ? headerTo : unique(envelopeTo),
      subject: parsed.subject ?? '',
      date: isValidDate(parsed.date) ? parsed.date.toISOString() : receivedAt.toISOString(),
      text: parsed.text ?? '',
      html: typeof parsed.html === 'string' ? parsed.html : null,
      links: [],
    };
    message.links = extractLinks(message.html, message.text);
    const recipients = new Set(
      [...headerTo, ...addresses(parsed.cc), ...addresses(parsed.bcc), ...envelopeTo].map((a) =>
        a.toLowerCase(),
      ),
    );
    this.items.set(message.id, { message, recipients, raw });
    while (this.items.size > this.capacity) {
      const oldest = this.items.keys().next().value;
      if (oldest === undefined) break;
      this.items.delete(oldest);
    }
    return message;
  }

  /** Newest first; `to` keeps the messages any of whose recipients is that address (any case). */
  list(to?: string): MailMessage[] {
    const wanted = to?.trim().toLowerCase();
    const all = [...this.items.values()].reverse();
    return all.filter((s) => !wanted || s.recipients.has(wanted)).map((s) => s.message);
  }

  get(id: string): MailMessage | undefined {
    return this.items.get(id)?.message;
  }

  /** The source exactly as it came in over SMTP (dot-stuffing undone). */
  raw(id: string): Buffer | undefined {
    return this.items.get(id)?.raw;
  }

  clear(): void {
    this.items.clear();
  }
}

function isValidDate(d: Date | undefined): d is Date {
  return d instanceof Date && !Number.isNaN(d.getTime());
}

function unique(values: string[]): string[] {
  return [...new Set(values)];
}

/** The mailbox addresses of an address header, groups flattened. */
function addresses(header: AddressObject | AddressObject[] | undefined): string[] {
  if (!header) return [];
  const out: string[] = [];
  const walk = (list: EmailAddress[]): void => {
    for (const a of list) {
      if (a.group) walk(a.group);
      else if (a.address) out.push(a.address);
    }
  };
  for (const h of Array.isArray(header) ? header : [header]) walk(h.value);
  return unique(out);
}

/**
 * The links a reader would click: the `href` values of `<a>` and `<area>` in the HTML body, or,
 * when the HTML has none (or there is no HTML), the http(s) URLs in the text body. Unique, in order.
 */
export function extractLinks(html: string | null, text: string): string[] {
  const fromHtml = html ? hrefs(html) : [];
  return fromHtml.length > 0 ? fromHtml : textUrls(text);
}

const HREF = /<(?:a|area)\b[^>]*?\shref\s*=\s*(?:"([^"]*)"|'([^']*)'|([^\s"'=<>`]+))/gi;

function hrefs(html: string): string[] {
  const withoutComments = html.replace(/<!--[\s\S]*?-->/g, '');
  const out: string[] = [];
  for (const m of withoutComments.matchAll(HREF)) {
    const value = decodeEntities(m[1] ?? m[2] ?? m[3] ?? '').trim();
    if (value && value !== '#') out.push(value);
  }
  return unique(out);
}

const TEXT_URL = /\bhttps?:\/\/[^\s<>"'`]+/gi;

function textUrls(text: string): string[] {
  const out: string[] = [];
  for (const [match] of text.matchAll(TEXT_URL)) {
    let url = match.replace(/[.,;:!?]+$/, '');
    // A closing bracket that the URL did not open belongs to the sentence: "(see https://x/y)".
    while (/[)\]]$/.test(url) && count(url, url.endsWith(')') ? '(' : '[') < count(url, url.at(-1) ?? '')) {
      url = url.slice(0, -1).replace(/[.,;:!?]+$/, '');
    }
    out.push(url);
  }
  return unique(out);
}

function count(s: string, ch: string): number {
  return s.split(ch).length - 1;
}

const NAMED: Record<string, string> = { amp: '&', lt: '<', gt: '>', quot: '"', apos: "'", nbsp: '\u00a0' };

/**
 * Character references in an attribute value: the named ones that occur in URLs and every numeric one,
 * each with its semicolon (a bare `&lt=2` in a query string stays as it is).
 */
function decodeEntities(s: string): string {
  return s.replace(/&(#x[0-9a-f]+|#[0-9]+|[a-z]+);/gi, (whole, ref: string) => {
    if (ref[0] === '#') {
      const code = ref[1] === 'x' || ref[1] === 'X' ? parseInt(ref.slice(2), 16) : parseInt(ref.slice(1), 10);
      return code > 0 && code <= 0x10ffff ? String.fromCodePoint(code) : whole;
    }
    return NAMED[ref.toLowerCase()] ?? whole;
  });
}
