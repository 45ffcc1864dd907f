import { applyDecorators, UseGuards } from '@nestjs/common';
import { ApiTooManyRequestsResponse } from '@nestjs/swagger';
import { ThrottlerGuard } from '@nestjs/throttler';

/**
 * Limits a route per client IP with the `auth` throttler (AUTH_RATE_LIMIT requests a minute,
 * configured in auth.module.ts); over the limit the answer is 429.
 */
export const AuthRateLimit = (): MethodDecorator & ClassDecorator =>
  applyDecorators(
    UseGuards(ThrottlerGuard),
    ApiTooManyRequestsResponse({ description: 'Too many attempts from this address; wait a minute.' }),
  );
