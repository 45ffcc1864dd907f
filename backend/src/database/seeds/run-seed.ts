import 'reflect-metadata';
import { randomBytes } from 'node:crypto';
import { existsSync, mkdirSync, writeFileSync } from 'node:fs';
import { dirname } from 'node:path';
import type { INestApplicationContext } from '@nestjs/common';
import { NestFactory } from '@nestjs/core';
import type { Role } from '@loamline/shared-types';
import { PasswordHasher } from '../../auth/password-hasher';
import { BaselineSheetsService } from '../../baseline-sheets/baseline-sheets.service';
import { BikesService } from '../../bikes/bikes.service';
import type { RequestUser } from '../../common/decorators/current-user.decorator';
import { ShopsService } from '../../shops/shops.service';
import type { User } from '../../users/user.entity';
import { UsersService } from '../../users/users.service';
import { DEMO_RIDERS, DEMO_SHOPS } from './demo-data';
import { seedBooking } from './seed-booking';
import { SeedModule } from './seed.module';

/**
 * The demo seed, run by `npm start` after the migrations (scripts/stack), and by its own API test
 * (test/demo-seed.e2e-spec.ts, against a throw-away file).
 * Once: when every demo account exists and the sign-ins file is there, it does nothing. Otherwise
 * it creates what is missing through the app's own services (bikes and sheets computed by the real
 * model), gives every demo account a fresh random password, and writes the sign-ins as plain text
 * lines to DEMO_ACCOUNTS_FILE, which the start command prints.
 */
const log = {
  log: (msg: string): void => console.log(`loamline seed: ${msg}`),
  warn: (msg: string): void => console.warn(`loamline seed: ${msg}`),
  error: (msg: string): void => console.error(`loamline seed: ${msg}`),
};

export interface SignIn {
  role: Role;
  email: string;
  password: string;
  where: string;
}

const newPassword = (): string => `demo-${randomBytes(9).toString('base64url')}`;

/**
 * Seeds the demo scenario into the database behind `app`, once (see above). Returns the sign-ins
 * it wrote, or null when everything was already there.
 */
export async function seedDemo(
  app: INestApplicationContext,
  file: string | undefined,
): Promise<SignIn[] | null> {
  const users = app.get(UsersService);
  const shops = app.get(ShopsService);
  const bikes = app.get(BikesService);
  const sheets = app.get(BaselineSheetsService);
  const hasher = app.get(PasswordHasher);

  const emails = [
    ...DEMO_SHOPS.flatMap((s) => s.staff.map((p) => p.email)),
    ...DEMO_RIDERS.map((r) => r.email),
  ];
  const existing = await Promise.all(emails.map((e) => users.findByEmail(e)));
  if (existing.every(Boolean) && file && existsSync(file)) return null;

  const signIns: SignIn[] = [];
  /** The user with this address (created when missing), with a fresh password either way. */
  const account = async (email: string, name: string, role: Role, shopId: string | null, where: string) => {
    const password = newPassword();
    const passwordHash = await hasher.hash(password);
    let user: User | null = await users.findByEmail(email);
    if (user) await users.setPassword(user.id, passwordHash);
    else user = await users.create({ email, name, role, shopId, passwordHash });
    signIns.push({ role, email, password, where });
    return (await users.findById(user.id))!;
  };

  for (const demo of DEMO_SHOPS) {
    const shop = (await shops.findBySlug(demo.shop.slug)) ?? (await shops.create(demo.shop));
    for (const person of demo.staff) {
      await account(person.email, person.name, person.role, shop.id, `${shop.name}, ${shop.town}`);
    }
  }
  for (const rider of DEMO_RIDERS) {
    const user = await account(rider.email, rider.name, 'rider', null, `rider near ${rider.near}`);
    const me: RequestUser = { ...users.toAuthUser(user), tokenVersion: user.tokenVersion };
    if ((await bikes.list(me)).length === 0) await bikes.create(me, rider.bike);
    if ((await sheets.list(me)).length === 0) await sheets.create(me, rider.sheet.name, rider.sheet.input);
  }
  await seedBooking(app);

  const width = Math.max(...signIns.map((s) => s.email.length));
  const lines = signIns.map(
    (s) => `  ${s.role.padEnd(10)} ${s.email.padEnd(width)}  ${s.password}  (${s.where})`,
  );
  const text = `${lines.join('\n')}\n`;
  if (file) {
    mkdirSync(dirname(file), { recursive: true });
    writeFileSync(file, text, { mode: 0o600 });
    log.log(`demo data seeded; sign-ins written to ${file}`);
  } else {
    log.warn('DEMO_ACCOUNTS_FILE is not set; the demo sign-ins are:');
    process.stdout.write(text);
  }
  return signIns;
}

async function main(): Promise<void> {
  // The seed sends no mail; the app's own relay sweeps the outbox.
  process.env.MAIL_RELAY_INTERVAL_MS = '0';
  const app = await NestFactory.createApplicationContext(SeedModule, { logger: ['error', 'warn'] });
  try {
    const done = await seedDemo(app, process.env.DEMO_ACCOUNTS_FILE);
    if (!done) log.log('demo data already there; nothing to do');
  } finally {
    await app.close();
  }
}

// Run as a script (`node dist/database/seeds/run-seed.js`); imported by a test, it only exports.
if (require.main === module) {
  main().catch((err: unknown) => {
    log.error(err instanceof Error ? (err.stack ?? err.message) : String(err));
    process.exit(1);
  });
}
