import { BadRequestException, Inject, Injectable, UnauthorizedException } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';
import { InjectDataSource, InjectRepository } from '@nestjs/typeorm';
import { IsNull, MoreThan, type DataSource, type Repository } from 'typeorm';
import type { AppConfig, AuthConfig } from '../config/app.config';
import { MailService } from '../mail/mail.service';
import { passwordResetMail } from '../mail/templates';
import type { User } from '../users/user.entity';
import { UsersService } from '../users/users.service';
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
    private readonly mail: MailService,
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
    const wait = this.delays.delayMs(email);
    if (wait > 0) await sleep(wait);
    const user = await this.users.findByEmailWithHash(email);
    const ok = user
      ? await this.hasher.verify(password, user.passwordHash)
      : await this.hasher.verifyNothing(password);
    if (!user || !ok) {
      this.delays.recordFailure(email);
      throw new UnauthorizedException('That e-mail address and password do not match an account.');
    }
    this.delays.recordSuccess(email);
    delete (user as Partial<User>).passwordHash;
    return user;
  }

  /**
   * E-mails a single-use reset link when the address has an account; says nothing either way.
   * Only the token's SHA-256 is stored. The mail goes out in the background, so the answer takes
   * the same time whether or not an account exists.
   */
  async requestPasswordReset(email: string): Promise<void> {
    const user = await this.users.findByEmail(email);
    if (!user) return;
    const token = newLinkToken();
    const minutes = this.auth.passwordResetTtlMinutes;
    await this.resetTokens.insert({
      userId: user.id,
      tokenHash: hashLinkToken(token),
      expiresAt: new Date(Date.now() + minutes * 60_000),
      usedAt: null,
    });
    const link = `${this.appUrl}/reset-password?token=${encodeURIComponent(token)}`;
    this.mail.sendInBackground(
      passwordResetMail(user.email, user.name, link, minutes),
      'a password-reset mail',
    );
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
      expiresAt: MoreThan(new Date()),
    });
    if (!found) throw invalidResetLink();
    const passwordHash = await this.hasher.hash(password);
    const now = new Date();
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
