import { Module } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';
import { APP_GUARD } from '@nestjs/core';
import { JwtModule } from '@nestjs/jwt';
import { PassportModule } from '@nestjs/passport';
import { ThrottlerModule } from '@nestjs/throttler';
import { TypeOrmModule } from '@nestjs/typeorm';
import { RolesGuard } from '../common/guards/roles.guard';
import type { AuthConfig } from '../config/app.config';
import { MailModule } from '../mail/mail.module';
import { UsersModule } from '../users/users.module';
import { AuthController } from './auth.controller';
import { AuthService } from './auth.service';
import { JwtAuthGuard } from './jwt-auth.guard';
import { JwtStrategy } from './jwt.strategy';
import { PasswordHasher } from './password-hasher';
import { PasswordResetToken } from './password-reset-token.entity';
import { SessionService } from './session.service';
import { SessionStore } from './session-store';
import { UserSession } from './user-session.entity';
import { RateLimitsModule } from './rate-limits/rate-limits.module';
import { SharedThrottlerStorage } from './rate-limits/shared-throttler-storage';

/**
 * Sign-in for the whole app: the two global guards (session, then roles), sessions as HS256 JWTs,
 * scrypt passwords, the `auth` rate limit and the failed sign-in delays (both shared through
 * MariaDB: rate-limits/) and password reset.
 */
@Module({
  imports: [
    UsersModule,
    MailModule,
    PassportModule,
    TypeOrmModule.forFeature([PasswordResetToken, UserSession]),
    JwtModule.registerAsync({
      inject: [ConfigService],
      useFactory: (config: ConfigService) => {
        const auth = config.getOrThrow<AuthConfig>('auth');
        return {
          secret: auth.jwtSecret,
          signOptions: { algorithm: 'HS256', expiresIn: auth.sessionTtlSeconds },
          verifyOptions: { algorithms: ['HS256'] },
        };
      },
    }),
    RateLimitsModule,
    // counts in MariaDB (rate_limit_hits), shared by every app instance: docs/scaling.md
    ThrottlerModule.forRootAsync({
      imports: [RateLimitsModule],
      inject: [ConfigService, SharedThrottlerStorage],
      useFactory: (config: ConfigService, storage: SharedThrottlerStorage) => ({
        storage,
        throttlers: [
          { name: 'auth', ttl: 60_000, limit: config.getOrThrow<AuthConfig>('auth').rateLimitPerMinute },
        ],
        errorMessage: 'Too many attempts from your address; wait a minute and try again.',
      }),
    }),
  ],
  controllers: [AuthController],
  providers: [
    AuthService,
    SessionService,
    SessionStore,
    JwtStrategy,
    { provide: PasswordHasher, useValue: new PasswordHasher() },
    { provide: APP_GUARD, useClass: JwtAuthGuard },
    { provide: APP_GUARD, useClass: RolesGuard },
  ],
  exports: [AuthService, SessionService, SessionStore, PasswordHasher, UsersModule],
})
export class AuthModule {}
