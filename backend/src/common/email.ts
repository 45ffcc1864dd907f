import { domainToASCII } from 'node:url';

/**
 * The one form of an e-mail address that is stored and compared (docs/security.md): Unicode NFC,
 * trimmed, lower-cased, and the domain in its ASCII (IDNA/punycode) form, so `exämple.test` is
 * stored as `xn--exmple-cua.test` and can never be mistaken for `example.test`. The database
 * compares these bytes exactly (binary collation), so `rîder@…` and `rider@…` are different
 * addresses. Returns '' for something that is not `local@domain` with a valid domain.
 */
export function normaliseEmail(input: string): string {
  const s = input.normalize('NFC').trim().toLowerCase();
  const at = s.lastIndexOf('@');
  if (at <= 0 || at === s.length - 1) return '';
  const local = s.slice(0, at);
  const domain = domainToASCII(s.slice(at + 1));
  if (!domain) return '';
  return `${local}@${domain}`;
}
