import { Module } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';
import { CLOCK, type Clock } from '../../common/clock/clock';
import type { AuthConfig } from '../../config/app.config';
import { SIGN_IN_DELAYS } from '../auth.constants';
import { SignInDelays } from '../sign-in-delays';
import { RATE_LIMIT_SCOPE } from './rate-limit-scope';
import { RateLimitSweep } from './rate-limit-sweep';
import { SharedThrottlerStorage } from './shared-throttler-storage';
import { SignInFailureTable } from './sign-in-failure-table';

/**
 * The auth routes' protections, kept in MariaDB so that every app instance sees the same counts:
 * the throttler storage (`rate_limit_hits`), the failed sign-ins per address (`sign_in_failures`)
 * and the sweep of their old rows.
 */
@Module({
  providers: [
    { provide: RATE_LIMIT_SCOPE, useValue: '' },
    SharedThrottlerStorage,
    SignInFailureTable,
    RateLimitSweep,
    {
      provide: SIGN_IN_DELAYS,
      inject: [ConfigService, SignInFailureTable, CLOCK],
      useFactory: (config: ConfigService, table: SignInFailureTable, clock: Clock) =>
        new SignInDelays(config.getOrThrow<AuthConfig>('auth').failureDelayMs, table, clock),
    },
  ],
  exports: [SharedThrottlerStorage, SIGN_IN_DELAYS, RateLimitSweep],
})
export class RateLimitsModule {}
