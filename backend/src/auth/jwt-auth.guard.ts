import { type ExecutionContext, HttpException, Injectable, UnauthorizedException } from '@nestjs/common';
import { databaseUnavailable, isDatabaseUnavailable } from '../common/filters/database-errors';
import { Reflector } from '@nestjs/core';
import { AuthGuard } from '@nestjs/passport';
import type { Response } from 'express';
import { IS_PUBLIC_KEY } from '../common/decorators/public.decorator';
import type { RequestUser } from '../common/decorators/current-user.decorator';
import type { SessionRequest } from './jwt.strategy';
import { SessionService } from './session.service';

/**
 * The global sign-in guard (APP_GUARD): every route needs a valid session unless it is marked
 * `@Public()`. A cookie session past half its lifetime gets a fresh cookie (same session) on the
 * way out. A database that does not answer is a 503, never a 401.
 */
@Injectable()
export class JwtAuthGuard extends AuthGuard('jwt') {
  constructor(
    private readonly reflector: Reflector,
    private readonly sessions: SessionService,
  ) {
    super();
  }

  override canActivate(context: ExecutionContext): boolean | Promise<boolean> {
    const isPublic = this.reflector.getAllAndOverride<boolean | undefined>(IS_PUBLIC_KEY, [
      context.getHandler(),
      context.getClass(),
    ]);
    if (isPublic) return true;
    return super.canActivate(context) as Promise<boolean>;
  }

  override handleRequest<TUser = RequestUser>(
    err: unknown,
    user: unknown,
    _info: unknown,
    context: ExecutionContext,
  ): TUser {
    if (err instanceof HttpException) throw err;
    // The database did not answer: that is an outage (503), not a signed-out user (401).
    if (isDatabaseUnavailable(err)) throw databaseUnavailable();
    if (err || !user) throw new UnauthorizedException('Sign in to continue.');
    const req = context.switchToHttp().getRequest<SessionRequest>();
    if (req.sessionToken?.fromCookie && this.sessions.isDueForRenewal(req.sessionToken.claims)) {
      const { claims } = req.sessionToken;
      this.sessions.renew(
        req,
        context.switchToHttp().getResponse<Response>(),
        user as RequestUser,
        claims.sid,
      );
    }
    return user as TUser;
  }
}
