import { BadRequestException, Inject, Injectable, UnauthorizedException } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';
import { InjectDataSource, InjectRepository } from '@nestjs/typeorm';
import { IsNull, MoreThan, type DataSource, type Repository } from 'typeorm';
import type { AppConfig, AuthConfig } from '../config/app.config';
import { CLOCK, type Clock } from '../common/clock/clock';
import { MailOutbox } from '../mail/outbox/mail-outbox';
import { passwordResetMail } from '../mail/templates';
import { User } from '../users/user.entity';
import { normaliseEmail, UsersService } from '../users/users.service';
import { PasswordHasher } from './password-hasher';
import { PasswordResetToken } from './password-reset-token.entity';
import { SIGN_IN_DELAYS } from './auth.constants';
import type { SignInDelays } from './sign-in-delays';
import { hashLinkToken, newLinkToken } from './tokens';

const sleep = (ms: number): Promise<void> => new Promise((r) => setTimeout(r, ms));

/** Accounts: register, check a sign-in, reset a forgotten password. Sessions: SessionService. */
@Injectable()
export class AuthService {
  private readonly auth: AuthConfig;
  private readonly appUrl: string;

  constructor(
    private readonly users: UsersService,
    private readonly hasher: PasswordHasher,
    private readonly outbox: MailOutbox,
    @Inject(CLOCK) private readonly clock: Clock,
    @Inject(SIGN_IN_DELAYS) private readonly delays: SignInDelays,
    @InjectRepository(PasswordResetToken) private readonly resetTokens: Repository<PasswordResetToken>,
    @InjectDataSource() private readonly dataSource: DataSource,
    config: ConfigService,
  ) {
    this.auth = config.getOrThrow<AuthConfig>('auth');
    this.appUrl = config.getOrThrow<AppConfig>('app').url.replace(/\/+$/, '');
  }

  /** A new rider account (staff join through an invitation instead). 409 when the address is taken. */
  async register(email: string, password: string, name: string): Promise<User> {
    const passwordHash = await this.hasher.hash(password);
    return this.users.create({ email, name, role: 'rider', shopId: null, passwordHash });
  }

  /**
   * The user whose address and password match, or 401 with one message for both cases (no hint
   * which was wrong). Unknown addresses cost the same scrypt work; repeated failures slow down.
   */
  async checkSignIn(email: string, password: string): Promise<User> {
    const wait = await this.delays.delayMs(email);
    if (wait > 0) await sleep(wait);
    const user = await this.users.findByEmailWithHash(email);
    const ok = user
      ? await this.hasher.verify(password, user.passwordHash)
      : await this.hasher.verifyNothing(password);
    if (!user || !ok) {
      await this.delays.recordFailure(email);
      throw new UnauthorizedException('That e-mail address and password do not match an account.');
    }
    await this.delays.recordSuccess(email);
    delete (user as Partial<User>).passwordHash;
    return user;
  }

  /**
   * E-mails a single-use reset link when the address has an account; says nothing either way.
   * Only the token's SHA-256 is stored; the mail is an outbox row written in the same transaction
   * as the token, so it is sent (with retries) even when the mail server is down right now.
   * Known and unknown addresses do the same work (a token, its hash, the mail rendered and sealed,
   * one transaction) and the answer waits until PASSWORD_RESET_MIN_MS have passed since the
   * request began, so its timing does not tell whether the address has an account. `began` is when the
   * request arrived (setup-app.ts stamps it before the guards), so the shared rate limit's database
   * write in front of this is inside the floor too, and its noise does not show either.
   */
  async requestPasswordReset(email: string, began = performance.now()): Promise<void> {
    const floor = async (): Promise<void> => {
      const left = this.auth.passwordResetMinMs - (performance.now() - began);
      if (left > 0) await sleep(left);
    };
    let mailId: string | null;
    try {
      mailId = await this.prepareReset(email);
    } catch (err) {
      await floor();
      throw err;
    }
    await floor();
    // Sent once the answer is on its way, so the sending does not show in its timing either.
    if (mailId) {
      const id = mailId;
      setImmediate(() => this.outbox.sendSoon([id]));
    }
  }

  private async prepareReset(email: string): Promise<string | null> {
    const token = newLinkToken();
    const tokenHash = hashLinkToken(token);
    const minutes = this.auth.passwordResetTtlMinutes;
    const expiresAt = new Date(this.clock.now().getTime() + minutes * 60_000);
    const link = `${this.appUrl}/reset-password?token=${encodeURIComponent(token)}`;
    return this.dataSource.transaction(async (manager) => {
      const user = await manager.getRepository(User).findOneBy({ email: normaliseEmail(email) });
      const mail = passwordResetMail(user?.email ?? email, user?.name ?? '', link, minutes);
      if (!user) {
        this.outbox.seal(mail); // the same work as for a known address, kept nowhere
        return null;
      }
      await manager.insert(PasswordResetToken, { userId: user.id, tokenHash, expiresAt, usedAt: null });
      return this.outbox.enqueue(manager, mail, { kind: 'password-reset', refId: user.id });
    });
  }

  /**
   * Sets the new password when the token is known, unused and unexpired; burns it (and every other
   * open reset link of that user) and bumps the token version, which ends all older sessions.
   */
  async confirmPasswordReset(token: string, password: string): Promise<void> {
    const tokenHash = hashLinkToken(token);
    const found = await this.resetTokens.findOneBy({
      tokenHash,
      usedAt: IsNull(),
      expiresAt: MoreThan(this.clock.now()),
    });
    if (!found) throw invalidResetLink();
    const passwordHash = await this.hasher.hash(password);
    const now = this.clock.now();
    await this.dataSource.transaction(async (manager) => {
      // The conditional update is what makes the link single-use, even for two requests at once.
      const burnt = await manager
        .createQueryBuilder()
        .update(PasswordResetToken)
        .set({ usedAt: now })
        .where('id = :id AND used_at IS NULL AND expires_at > :now', { id: found.id, now })
        .execute();
      if (burnt.affected !== 1) throw invalidResetLink();
      await manager
        .createQueryBuilder()
        .update(PasswordResetToken)
        .set({ usedAt: now })
        .where('user_id = :userId AND used_at IS NULL', { userId: found.userId })
        .execute();
      await this.users.setPassword(found.userId, passwordHash, manager);
    });
  }
}

const invalidResetLink = (): BadRequestException =>
  new BadRequestException({
    message: 'This reset link is not valid any more: it was used already or has expired. Ask for a new one.',
    fields: { token: 'is used or expired' },
  });
