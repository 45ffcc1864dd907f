import { scryptSync } from 'node:crypto';
import { OWASP_SCRYPT, PasswordHasher, formatHash, parseHash, scryptAsync } from './password-hasher';

/** RFC 7914 §12 test vectors (hex, as printed in the RFC; dkLen = 64). */
const RFC7914_VECTORS = [
  {
    P: '',
    S: '',
    N: 16,
    r: 1,
    p: 1,
    dk:
      '77d6576238657b203b19ca42c18a0497f16b4844e3074ae8dfdffa3fede21442' +
      'fcd0069ded0948f8326a753a0fc81f17e8d3e0fb2e0d3628cf35e20c38d18906',
  },
  {
    P: 'password',
    S: 'NaCl',
    N: 1024,
    r: 8,
    p: 16,
    dk:
      'fdbabe1c9d3472007856e7190d01e9fe7c6ad7cbc8237830e77376634b373162' +
      '2eaf30d92e22a3886ff109279d9830dac727afb94a83ee6d8360cbdfa2cc0640',
  },
  {
    P: 'pleaseletmein',
    S: 'SodiumChloride',
    N: 16384,
    r: 8,
    p: 1,
    dk:
      '7023bdcb3afd7348461c06cd81fd38ebfda8fbba904f8e3ea9b543f6545da1f2' +
      'd5432955613f0fcf62d49705242a9af9e61e85dc0d651e40dfcf017b45575887',
  },
];

describe('scrypt primitive (crypto.scrypt) against RFC 7914 §12', () => {
  it.each(RFC7914_VECTORS)(
    'scrypt(P="$P", S="$S", N=$N, r=$r, p=$p, dkLen=64)',
    async ({ P, S, N, r, p, dk }) => {
      const key = await scryptAsync(P, Buffer.from(S), 64, { N, r, p });
      expect(key.toString('hex')).toBe(dk);
    },
  );
});

describe('PasswordHasher', () => {
  // OWASP's parameters (N = 2^17, r = 8, p = 1) are what the app uses; each hash takes ~0.3 s here.
  const hasher = new PasswordHasher();

  it('stores OWASP parameters, a 16-byte salt and a 32-byte key in one string', async () => {
    const stored = await hasher.hash('correct horse battery');
    expect(stored).toMatch(/^\$scrypt\$ln=17,r=8,p=1\$[A-Za-z0-9+/]{22}\$[A-Za-z0-9+/]{43}$/);
    const parsed = parseHash(stored)!;
    expect(parsed.params).toEqual(OWASP_SCRYPT);
    expect(parsed.salt).toHaveLength(16);
    expect(parsed.key).toHaveLength(32);
    // the stored key is scrypt itself over the password and that salt (checked with the sync API)
    const again = scryptSync('correct horse battery', parsed.salt, 32, {
      ...OWASP_SCRYPT,
      maxmem: 512 * 1024 * 1024,
    });
    expect(again.equals(parsed.key)).toBe(true);
  });

  it('verifies the right password and refuses a wrong one', async () => {
    const stored = await hasher.hash('correct horse battery');
    await expect(hasher.verify('correct horse battery', stored)).resolves.toBe(true);
    await expect(hasher.verify('correct horse batterY', stored)).resolves.toBe(false);
    await expect(hasher.verify('', stored)).resolves.toBe(false);
  });

  it('salts every hash: the same password twice gives two different strings, both verify', async () => {
    const [h1, h2] = await Promise.all([hasher.hash('same password'), hasher.hash('same password')]);
    expect(h1).not.toBe(h2);
    await expect(hasher.verify('same password', h1)).resolves.toBe(true);
    await expect(hasher.verify('same password', h2)).resolves.toBe(true);
  });

  it('verifies with the parameters stored in the hash (cheaper older hashes still work)', async () => {
    const cheap = new PasswordHasher({ N: 1024, r: 8, p: 1 });
    const stored = await cheap.hash('older account');
    expect(stored.startsWith('$scrypt$ln=10,r=8,p=1$')).toBe(true);
    await expect(hasher.verify('older account', stored)).resolves.toBe(true);
  });

  it('treats composed and decomposed accents as the same password (NFKC)', async () => {
    const stored = await hasher.hash('Gr\u00fcnwald-Pfad');
    await expect(hasher.verify('Gru\u0308nwald-Pfad', stored)).resolves.toBe(true);
  });

  it('refuses malformed or tampered hashes without computing them', async () => {
    const stored = await hasher.hash('pw');
    const tooCostly = stored.replace('ln=17', 'ln=30');
    const truncated = stored.slice(0, -10); // a prefix of the key (scrypt's shorter output is a prefix)
    for (const bad of ['', 'plain-text', '$2b$10$abcdefghijklmnopqrstuv', tooCostly, truncated]) {
      await expect(hasher.verify('pw', bad)).resolves.toBe(false);
    }
  });

  it('formatHash and parseHash round-trip', () => {
    const salt = Buffer.alloc(16, 7);
    const key = Buffer.alloc(32, 9);
    const parsed = parseHash(formatHash({ N: 2 ** 15, r: 8, p: 2 }, salt, key))!;
    expect(parsed.params).toEqual({ N: 2 ** 15, r: 8, p: 2 });
    expect(parsed.salt.equals(salt)).toBe(true);
    expect(parsed.key.equals(key)).toBe(true);
  });

  it('verifyNothing spends a verification and is always false', async () => {
    await expect(hasher.verifyNothing('anything')).resolves.toBe(false);
  });
});
