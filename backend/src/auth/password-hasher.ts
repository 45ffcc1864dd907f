import { randomBytes, scrypt, timingSafeEqual } from 'node:crypto';

export interface ScryptParams {
  /** CPU/memory cost, a power of two */
  N: number;
  /** block size */
  r: number;
  /** parallelisation */
  p: number;
}

/** OWASP Password Storage Cheat Sheet, scrypt: N = 2^17, r = 8, p = 1 (uses 128·N·r bytes = 128 MiB). */
export const OWASP_SCRYPT: ScryptParams = { N: 2 ** 17, r: 8, p: 1 };
const SALT_BYTES = 16;
const KEY_BYTES = 32;
/** a stored hash asking for more than this is refused rather than computed (a tampered row must not eat the memory) */
const MAX_LOG2_N = 20;
const PREFIX = '$scrypt$';

/** Node's own `crypto.scrypt`, with `maxmem` raised to what the parameters need (its default is 32 MiB). */
export function scryptAsync(
  password: string | Buffer,
  salt: Buffer | string,
  keyLength: number,
  { N, r, p }: ScryptParams,
): Promise<Buffer> {
  const maxmem = 128 * N * r * 2 + 1024 * 1024;
  return new Promise((resolve, reject) => {
    scrypt(password, salt, keyLength, { N, r, p, maxmem }, (err, key) => (err ? reject(err) : resolve(key)));
  });
}

const b64 = (b: Buffer): string => b.toString('base64').replace(/=+$/, '');

/** `$scrypt$ln=17,r=8,p=1$<salt, base64>$<key, base64>`: the parameters travel with each hash. */
export function formatHash(params: ScryptParams, salt: Buffer, key: Buffer): string {
  return `${PREFIX}ln=${Math.log2(params.N)},r=${params.r},p=${params.p}$${b64(salt)}$${b64(key)}`;
}

export function parseHash(stored: string): { params: ScryptParams; salt: Buffer; key: Buffer } | null {
  const m = /^\$scrypt\$ln=(\d{1,2}),r=(\d{1,2}),p=(\d{1,2})\$([A-Za-z0-9+/]+)\$([A-Za-z0-9+/]+)$/.exec(
    stored,
  );
  if (!m) return null;
  const [ln, r, p] = [Number(m[1]), Number(m[2]), Number(m[3])];
  if (ln < 1 || ln > MAX_LOG2_N || r < 1 || p < 1) return null;
  const salt = Buffer.from(m[4], 'base64');
  const key = Buffer.from(m[5], 'base64');
  // exactly our key length: scrypt's output for a shorter length is a prefix of the longer one, so a
  // truncated hash must not verify
  if (salt.length < SALT_BYTES || key.length !== KEY_BYTES) return null;
  return { params: { N: 2 ** ln, r, p }, salt, key };
}

/** The same text for the same password however it was typed (composed or decomposed accents). */
const normalise = (password: string): string => password.normalize('NFKC');

/**
 * Password hashing with scrypt (RFC 7914) at OWASP's parameters, a 16-byte random salt per
 * password, the parameters stored with the hash, and a constant-time comparison. Provided with
 * `useValue` (auth.module.ts), so tests can build one with cheaper parameters.
 */
export class PasswordHasher {
  private dummy: Promise<string> | null = null;

  constructor(private readonly params: ScryptParams = OWASP_SCRYPT) {}

  async hash(password: string): Promise<string> {
    const salt = randomBytes(SALT_BYTES);
    const key = await scryptAsync(normalise(password), salt, KEY_BYTES, this.params);
    return formatHash(this.params, salt, key);
  }

  async verify(password: string, stored: string): Promise<boolean> {
    const parsed = parseHash(stored);
    if (!parsed) return false;
    const key = await scryptAsync(normalise(password), parsed.salt, parsed.key.length, parsed.params);
    return timingSafeEqual(key, parsed.key);
  }

  /** Spends the time of one verification, for a sign-in with an unknown address (no timing hint). */
  async verifyNothing(password: string): Promise<false> {
    this.dummy ??= this.hash(randomBytes(16).toString('hex'));
    await this.verify(password, await this.dummy);
    return false;
  }
}
