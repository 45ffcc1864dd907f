import { createHash, randomBytes } from 'node:crypto';

/** A fresh single-use token for an e-mailed link: 32 random bytes, base64url (43 characters). */
export const newLinkToken = (): string => randomBytes(32).toString('base64url');

/** What the database keeps of a link token: its SHA-256, hex. */
export const hashLinkToken = (token: string): string =>
  createHash('sha256').update(token, 'utf8').digest('hex');
