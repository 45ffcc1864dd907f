import { createCipheriv, createDecipheriv, hkdfSync, randomBytes } from 'node:crypto';

const VERSION = 1;

/**
 * AES-256-GCM for outbox payloads, with a key derived (HKDF-SHA256) from the server's signing
 * secret: a copy of the database alone does not reveal the reset and invitation links waiting to
 * be sent. Layout: version (1 byte) | IV (12) | tag (16) | ciphertext.
 */
export class OutboxCrypto {
  private readonly key: Buffer;

  constructor(secret: string) {
    this.key = Buffer.from(hkdfSync('sha256', secret, 'loamline', 'mail-outbox v1', 32));
  }

  seal(plain: string): Buffer {
    const iv = randomBytes(12);
    const cipher = createCipheriv('aes-256-gcm', this.key, iv);
    const body = Buffer.concat([cipher.update(plain, 'utf8'), cipher.final()]);
    return Buffer.concat([Buffer.from([VERSION]), iv, cipher.getAuthTag(), body]);
  }

  /** The plain text, or throws when the payload was made with another key or changed. */
  open(sealed: Buffer): string {
    if (sealed.length < 29 || sealed[0] !== VERSION) throw new Error('unknown outbox payload format');
    const decipher = createDecipheriv('aes-256-gcm', this.key, sealed.subarray(1, 13));
    decipher.setAuthTag(sealed.subarray(13, 29));
    return Buffer.concat([decipher.update(sealed.subarray(29)), decipher.final()]).toString('utf8');
  }
}
